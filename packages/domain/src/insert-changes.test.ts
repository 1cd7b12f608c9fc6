// Retentive-insert changes of an overdenture. Source of the maintenance measure: prosthetic
// maintenance of implant overdentures reported as events per patient-year (Cehreli MC et al. 2010,
// Int J Oral Maxillofac Implants 25(1):163–180 [memory]); the 12-month review interval is
// [common practice]; the overdue day (the day after the due day) and the 12-month window are [decision].
// Worked dates are counted by hand below, independently of the calendar code.
import { describe, expect, it } from 'vitest';
import {
  DEFAULT_INSERT_REVIEW_MONTHS,
  insertChangeHistory,
  insertChangeSummary,
  insertReviewDueOn,
  insertReviewOverdue,
  wholeMonthsBetween,
} from './insert-changes.js';

describe('insertChangeSummary', () => {
  it('gives the interval since the last change and the counts per 12 months and per calendar year', () => {
    // Beatrix-like history: changes on 2024-03-10, 2025-01-20 and 2025-11-05; today 2026-02-01.
    const s = insertChangeSummary(['2025-01-20', '2024-03-10', '2025-11-05'], '2026-02-01');
    expect(s.lastChangeOn).toBe('2025-11-05');
    // 2025-11-05 → 2026-02-01: 25 (rest of Nov) + 31 (Dec) + 31 (Jan) + 1 = 88 days; 2 whole months (to 2026-01-05).
    expect(s.daysSinceLast).toBe(88);
    expect(s.monthsSinceLast).toBe(2);
    // The last 12 months are 2025-02-02 … 2026-02-01: only 2025-11-05 (2025-01-20 is before).
    expect(s.last12Months).toBe(1);
    expect(s.perYear).toEqual([
      { year: 2024, count: 1 },
      { year: 2025, count: 2 },
    ]);
  });

  it('counts a change on the same day a year ago out of the last 12 months, the next day in', () => {
    expect(insertChangeSummary(['2025-02-01'], '2026-02-01').last12Months).toBe(0);
    expect(insertChangeSummary(['2025-02-02'], '2026-02-01').last12Months).toBe(1);
  });

  it('has nothing to show without changes', () => {
    expect(insertChangeSummary([], '2026-02-01')).toEqual({
      lastChangeOn: null,
      daysSinceLast: null,
      monthsSinceLast: null,
      last12Months: 0,
      perYear: [],
    });
  });

  it('refuses a change dated in the future and a day that is no date', () => {
    expect(() => insertChangeSummary(['2026-02-02'], '2026-02-01')).toThrow(/future/);
    expect(() => insertChangeSummary(['2025-02-30'], '2026-02-01')).toThrow(/real date/);
  });
});

describe('wholeMonthsBetween', () => {
  it('counts whole calendar months, a short month clamped', () => {
    expect(wholeMonthsBetween('2025-11-05', '2026-01-04')).toBe(1);
    expect(wholeMonthsBetween('2025-11-05', '2026-01-05')).toBe(2);
    // 31 Jan + 1 month is 29 Feb in a leap year.
    expect(wholeMonthsBetween('2024-01-31', '2024-02-29')).toBe(1);
    expect(wholeMonthsBetween('2024-01-31', '2024-02-28')).toBe(0);
  });
});

describe('insert review (default 12 months [common practice])', () => {
  it('is due the interval after the last change and overdue from the day after', () => {
    expect(DEFAULT_INSERT_REVIEW_MONTHS).toBe(12);
    expect(insertReviewDueOn('2025-03-14', 12)).toBe('2026-03-14');
    expect(insertReviewOverdue('2025-03-14', 12, '2026-03-13')).toBe(false);
    expect(insertReviewOverdue('2025-03-14', 12, '2026-03-14')).toBe(false);
    expect(insertReviewOverdue('2025-03-14', 12, '2026-03-15')).toBe(true);
  });

  it("follows the practice's own interval; a day missing in the due month is clamped", () => {
    expect(insertReviewDueOn('2025-08-31', 6)).toBe('2026-02-28');
    expect(insertReviewOverdue('2025-08-31', 6, '2026-03-01')).toBe(true);
    expect(insertReviewOverdue('2025-08-31', 6, '2026-02-28')).toBe(false);
  });

  it('refuses an interval outside 1–60 whole months', () => {
    expect(() => insertReviewDueOn('2025-03-14', 0)).toThrow(/whole months/);
    expect(() => insertReviewDueOn('2025-03-14', 1.5)).toThrow(/whole months/);
    expect(() => insertReviewDueOn('2025-03-14', 61)).toThrow(/whole months/);
  });
});

describe('insertChangeHistory', () => {
  const reasons = ['retention-loss', 'wear', 'fracture'] as const;
  it('counts the changes per calendar year by reason, a quiet year as zeros, up to today’s year', () => {
    // Worked by hand: 2022 one wear; 2023 none; 2024 a retention loss and a fracture; 2025 none yet;
    // today 2025-06-30, so the chart runs 2022 … 2025 (four bars).
    const years = insertChangeHistory(
      [
        { changedOn: '2024-11-03', reason: 'fracture' },
        { changedOn: '2022-04-19', reason: 'wear' },
        { changedOn: '2024-02-07', reason: 'retention-loss' },
      ],
      '2025-06-30',
      reasons,
    );
    expect(years).toEqual([
      { year: 2022, total: 1, byReason: { 'retention-loss': 0, wear: 1, fracture: 0 } },
      { year: 2023, total: 0, byReason: { 'retention-loss': 0, wear: 0, fracture: 0 } },
      { year: 2024, total: 2, byReason: { 'retention-loss': 1, wear: 0, fracture: 1 } },
      { year: 2025, total: 0, byReason: { 'retention-loss': 0, wear: 0, fracture: 0 } },
    ]);
  });
  it('is empty when no change is recorded (the Timeline shows its empty state)', () => {
    expect(insertChangeHistory([], '2025-06-30', reasons)).toEqual([]);
  });
  it('refuses a change after today and a reason outside the list', () => {
    expect(() => insertChangeHistory([{ changedOn: '2025-07-01', reason: 'wear' }], '2025-06-30', reasons)).toThrow(
      'Cannot be in the future',
    );
    expect(() =>
      insertChangeHistory([{ changedOn: '2025-01-01', reason: 'lost' as 'wear' }], '2025-06-30', reasons),
    ).toThrow('Not a reason of the list');
  });
});
