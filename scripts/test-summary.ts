// Prints the closing line of the test command from vitest's JSON report, and fails on any failed step.
import fs from 'node:fs';

const [reportFile, ...failedSteps] = process.argv.slice(2);
let passed = 0;
let failed = 0;
let skipped = 0;
if (fs.existsSync(reportFile)) {
  const report = JSON.parse(fs.readFileSync(reportFile, 'utf8')) as { numPassedTests: number; numFailedTests: number; numPendingTests: number; numTodoTests: number; success: boolean };
  passed = report.numPassedTests;
  failed = report.numFailedTests;
  skipped = report.numPendingTests + report.numTodoTests;
}
// A step that failed outside the test runner (typecheck, lint, build, a suite that could not start) counts as a failure.
const suiteFailedWithoutTests = failedSteps.includes('tests') && failed === 0;
failed += failedSteps.filter((s) => s !== 'tests').length + (suiteFailedWithoutTests ? 1 : 0);
if (failedSteps.length) console.log(`failed steps: ${failedSteps.join(', ')}`);
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
process.exit(failed > 0 || passed === 0 ? 1 : 0);
