// Reads a tier's Vitest JSON report into the counts `npm test` prints, and names each failure: a
// CI log is often read only from its end, so the closing summary says which tests failed and why
// (the first line of the message), with the order seed that replays the run.
import path from 'node:path';

/** At most this many failures are named per tier; the rest are counted. */
const NAMED_FAILURES = 20;

/**
 * @param {any} report Vitest's JSON report (`--reporter=json`).
 * @param {string} root the repository root, to print paths relative to it.
 * @returns {{ passed: number, failed: number, failures: string[] }}
 */
export function summarizeReport(report, root) {
  const failures = [];
  let brokenFiles = 0;
  for (const file of report.testResults ?? []) {
    const where = path.relative(root, file.name);
    const failedTests = (file.assertionResults ?? []).filter((a) => a.status === 'failed');
    // A file that failed without a failing test (e.g. an import error or a failing hook).
    if (file.status === 'failed' && failedTests.length === 0) {
      brokenFiles += 1;
      failures.push(`${where}: ${firstLine(file.message) || 'the file failed to run'}`);
    }
    for (const test of failedTests)
      failures.push(`${where} > ${test.fullName}: ${firstLine(test.failureMessages?.[0])}`);
  }
  const named = failures.slice(0, NAMED_FAILURES);
  if (failures.length > named.length) named.push(`… and ${failures.length - named.length} more`);
  return { passed: report.numPassedTests ?? 0, failed: (report.numFailedTests ?? 0) + brokenFiles, failures: named };
}

/** The first non-empty line of a message, without terminal colours, cut to 300 characters. */
function firstLine(message) {
  // eslint-disable-next-line no-control-regex
  const plain = String(message ?? '').replace(/\u001b\[[0-9;]*m/g, '');
  const line = plain.split('\n').find((l) => l.trim() !== '') ?? '';
  return line.trim().slice(0, 300);
}
