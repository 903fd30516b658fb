// One timed run of wrk against one endpoint. wrk (C, two threads) is the load driver rather than a Node
// client: on a two-core machine the driver competes with the server for CPU, and wrk needs far less of it
// than a JavaScript client pushing the same rate, so the figures say more about the app.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const LUA = path.join(path.dirname(fileURLToPath(import.meta.url)), 'wrk.lua');

export interface WrkLine {
  method: 'GET' | 'POST' | 'PATCH';
  path: string;
  cookie?: string;
  body?: unknown;
}

export interface WrkResult {
  requests: number;
  seconds: number;
  requestsPerSecond: number;
  p50Ms: number;
  p90Ms: number;
  p99Ms: number;
  meanMs: number;
  maxMs: number;
  /** Answers outside 2xx/3xx, and socket errors and timeouts. */
  badStatus: number;
  socketErrors: number;
  /** Load average (1 minute) as the run ended. */
  loadAverage: number;
}

export interface WrkOptions {
  baseUrl: string;
  lines: WrkLine[];
  connections: number;
  seconds: number;
  threads?: number;
  uniqueAddress?: boolean;
}

export function writeLines(lines: WrkLine[]): string {
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'lacewright-bench-')), 'lines.tsv');
  const text = lines.map((l) => [l.method, l.path, l.cookie ?? '', l.body === undefined ? '' : JSON.stringify(l.body)].join('\t')).join('\n');
  fs.writeFileSync(file, text + '\n');
  return file;
}

export async function runWrk(o: WrkOptions): Promise<WrkResult> {
  if (o.lines.length === 0) throw new Error('nothing to send');
  const threads = o.threads ?? 2;
  const file = writeLines(o.lines);
  const args = ['-t', String(threads), '-c', String(o.connections), '-d', `${o.seconds}s`, '--timeout', '10s', '-s', LUA, o.baseUrl];
  const output = await new Promise<string>((resolve, reject) => {
    const child = spawn('wrk', args, {
      env: { ...process.env, BENCH_FILE: file, BENCH_THREADS: String(threads), BENCH_UNIQUE_ADDRESS: o.uniqueAddress ? '1' : '0' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let out = '';
    child.stdout.on('data', (c: Buffer) => (out += c.toString()));
    child.stderr.on('data', (c: Buffer) => (out += c.toString()));
    child.on('error', reject);
    child.on('exit', (code) => (code === 0 ? resolve(out) : reject(new Error(`wrk exited ${code}: ${out}`))));
  });
  fs.rmSync(path.dirname(file), { recursive: true, force: true });
  const line = output.split('\n').find((l) => l.startsWith('BENCH_RESULT '));
  if (!line) throw new Error(`wrk printed no result:\n${output}`);
  const r = JSON.parse(line.slice('BENCH_RESULT '.length)) as {
    requests: number;
    durationUs: number;
    p50Us: number;
    p90Us: number;
    p99Us: number;
    meanUs: number;
    maxUs: number;
    errors: { connect: number; read: number; write: number; status: number; timeout: number };
  };
  const seconds = r.durationUs / 1e6;
  const ms = (us: number) => Math.round(us / 10) / 100;
  return {
    requests: r.requests,
    seconds: Math.round(seconds * 100) / 100,
    requestsPerSecond: Math.round((r.requests / seconds) * 10) / 10,
    p50Ms: ms(r.p50Us),
    p90Ms: ms(r.p90Us),
    p99Ms: ms(r.p99Us),
    meanMs: ms(r.meanUs),
    maxMs: ms(r.maxUs),
    badStatus: r.errors.status,
    socketErrors: r.errors.connect + r.errors.read + r.errors.write + r.errors.timeout,
    loadAverage: Math.round(os.loadavg()[0] * 100) / 100,
  };
}
