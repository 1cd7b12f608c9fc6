import { describe, expect, it } from 'vitest';
import { summarizeReport } from './test-report.mjs';

const root = '/repo';

describe('the closing summary of a tier', () => {
  it('counts and names failed tests and files that failed without a test', () => {
    const report = {
      numPassedTests: 5,
      numFailedTests: 1,
      testResults: [
        {
          name: '/repo/apps/api/test/a.e2e-spec.ts',
          status: 'failed',
          assertionResults: [
            { status: 'passed', fullName: 'a works' },
            {
              status: 'failed',
              fullName: 'a > refuses a bad date',
              failureMessages: ['\n\u001b[31mAssertionError: expected 400 to be 201\u001b[39m\n    at x.ts:1'],
            },
          ],
        },
        {
          name: '/repo/apps/api/test/b.e2e-spec.ts',
          status: 'failed',
          message: 'Hook timed out in 30000ms',
          assertionResults: [],
        },
        { name: '/repo/apps/api/test/c.e2e-spec.ts', status: 'passed', assertionResults: [{ status: 'passed' }] },
      ],
    };
    expect(summarizeReport(report, root)).toEqual({
      passed: 5,
      failed: 2,
      failures: [
        'apps/api/test/a.e2e-spec.ts > a > refuses a bad date: AssertionError: expected 400 to be 201',
        'apps/api/test/b.e2e-spec.ts: Hook timed out in 30000ms',
      ],
    });
  });

  it('names at most twenty failures and counts the rest', () => {
    const assertionResults = Array.from({ length: 23 }, (_, i) => ({
      status: 'failed',
      fullName: `t${i}`,
      failureMessages: ['x'],
    }));
    const summary = summarizeReport(
      {
        numPassedTests: 0,
        numFailedTests: 23,
        testResults: [{ name: '/repo/f.ts', status: 'failed', assertionResults }],
      },
      root,
    );
    expect(summary.failed).toBe(23);
    expect(summary.failures).toHaveLength(21);
    expect(summary.failures.at(-1)).toBe('… and 3 more');
  });
});
