// Prints the closing line of the test command from vitest's JSON report, and fails on any failed step.
import fs from 'node:fs';
import { readProof } from '../tests/support/summary';

const [reportFile, ...failedSteps] = process.argv.slice(2);
let passed = 0;
let failed = 0;
let skipped = 0;
let journeys = 0;
if (fs.existsSync(reportFile)) {
  const report = JSON.parse(fs.readFileSync(reportFile, 'utf8')) as {
    numPassedTests: number;
    numFailedTests: number;
    numPendingTests: number;
    numTodoTests: number;
    success: boolean;
    testResults?: { name: string; assertionResults: { status: string }[] }[];
  };
  passed = report.numPassedTests;
  failed = report.numFailedTests;
  skipped = report.numPendingTests + report.numTodoTests;
  // Journeys: the passed tests of the browser journey files (tests/e2e/*journey* and *-browser*).
  for (const file of report.testResults ?? []) {
    if (/tests\/e2e\/[^/]*(journey|browser)[^/]*\.test\.ts$/.test(file.name)) journeys += file.assertionResults.filter((a) => a.status === 'passed').length;
  }
}

// What the adversarial tests proved, as one line (figures the tests wrote to test-results/proof-summary.jsonl).
const proof = readProof();
if (proof.sources.length || journeys) {
  const n = (v: number) => v.toLocaleString('en-US');
  console.log(
    `proof: ${n(journeys)} journeys passed, ${n(proof.routeChecks)} route x principal checks, ${n(proof.hostileBodies)} hostile bodies, ` +
      `${n(proof.raceRuns)} race runs, ${n(proof.faultsInjected)} faults injected; ${n(proof.lostRecords)} lost and ${n(proof.duplicatedRecords)} duplicated records`,
  );
}
// A step that failed outside the test runner (typecheck, lint, build, a suite that could not start) counts as a failure.
const suiteFailedWithoutTests = failedSteps.includes('tests') && failed === 0;
failed += failedSteps.filter((s) => s !== 'tests').length + (suiteFailedWithoutTests ? 1 : 0);
if (failedSteps.length) console.log(`failed steps: ${failedSteps.join(', ')}`);
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
process.exit(failed > 0 || passed === 0 ? 1 : 0);
