// A provisional is overdue from the day after its planned replacement [decision]: no clinical source
// sets the day; the planned day itself is still on time.
import { describe, expect, it } from 'vitest';
import { provisionalOverdue } from './provisional.js';

describe('provisionalOverdue', () => {
  it('is on time on the planned day and overdue the day after', () => {
    expect(provisionalOverdue('2026-09-15', '2026-09-14')).toBe(false);
    expect(provisionalOverdue('2026-09-15', '2026-09-15')).toBe(false);
    expect(provisionalOverdue('2026-09-15', '2026-09-16')).toBe(true);
  });
  it('refuses a day that is no date', () => {
    expect(() => provisionalOverdue('2026-02-30', '2026-03-01')).toThrow(/real date/);
  });
});
