// Figures the adversarial tests report, for the one summary line the test command prints at its end
// (scripts/test-summary.ts). Each test file appends a JSON line; test files run in separate processes.
import fs from 'node:fs';
import path from 'node:path';

export interface ProofCounts {
  /** Route and method checked as one principal, with the expected status. */
  routeChecks: number;
  /** Generated hostile request bodies (and paths) sent to write routes. */
  hostileBodies: number;
  /** Rounds of parallel calls racing on the same rows. */
  raceRuns: number;
  /** Outages and misbehaviours injected (a service stopped, a connection dropped, an event duplicated). */
  faultsInjected: number;
  /** Records found missing, or found twice, where the invariants allow exactly one. */
  lostRecords: number;
  duplicatedRecords: number;
}

export const SUMMARY_FILE = path.resolve(process.env.LACEWRIGHT_SUMMARY_FILE ?? 'test-results/proof-summary.jsonl');

export function recordProof(source: string, counts: Partial<ProofCounts>): void {
  fs.mkdirSync(path.dirname(SUMMARY_FILE), { recursive: true });
  fs.appendFileSync(SUMMARY_FILE, JSON.stringify({ source, at: new Date().toISOString(), ...counts }) + '\n');
}

export function readProof(file = SUMMARY_FILE): ProofCounts & { sources: string[] } {
  const total: ProofCounts & { sources: string[] } = { routeChecks: 0, hostileBodies: 0, raceRuns: 0, faultsInjected: 0, lostRecords: 0, duplicatedRecords: 0, sources: [] };
  if (!fs.existsSync(file)) return total;
  for (const line of fs.readFileSync(file, 'utf8').split('\n')) {
    if (!line.trim()) continue;
    const entry = JSON.parse(line) as Partial<ProofCounts> & { source: string };
    for (const key of ['routeChecks', 'hostileBodies', 'raceRuns', 'faultsInjected', 'lostRecords', 'duplicatedRecords'] as const) total[key] += entry[key] ?? 0;
    if (!total.sources.includes(entry.source)) total.sources.push(entry.source);
  }
  return total;
}
