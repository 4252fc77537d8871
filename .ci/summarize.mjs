// Reads a vitest JSON report and prints exactly one line: "N passed, M failed".
// Usage: node .ci/summarize.mjs <report.json> <exit code of the test command>
// Exits 1 when anything failed, the command failed, or the report is missing or unreadable.
import { readFileSync } from 'node:fs';
import process from 'node:process';

const [reportPath = '', rcArg = '1'] = process.argv.slice(2);
const rc = Number.parseInt(rcArg, 10);

let passed = 0;
let failed = 0;
let sound = false;
try {
  const report = JSON.parse(readFileSync(reportPath, 'utf8'));
  const count = (v) => (Number.isInteger(v) && v >= 0 ? v : 0);
  passed = count(report.numPassedTests);
  failed = count(report.numFailedTests);
  // A test file that fails to load or errors outside a test has no failed test of its own: count it once.
  const files = Array.isArray(report.testResults) ? report.testResults : [];
  for (const file of files) {
    const tests = Array.isArray(file?.assertionResults) ? file.assertionResults : [];
    if (file?.status === 'failed' && !tests.some((t) => t?.status === 'failed')) failed += 1;
  }
  sound = report.success === true;
} catch {
  // Missing or unreadable report: typecheck or lint stopped the run, or vitest crashed.
}

if ((!sound || rc !== 0) && failed === 0) failed = 1;
process.stdout.write(`${passed} passed, ${failed} failed\n`);
process.exitCode = failed > 0 || rc !== 0 || !sound ? 1 : 0;
