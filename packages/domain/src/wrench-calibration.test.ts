// Wrench calibration interval: the practice's own; default 12 months [common practice] (commonly
// attributed to ISO 6789-1:2017; the standard's text was not available to check). No calibration
// recorded counts as overdue [decision].
import { describe, expect, it } from 'vitest';
import {
  calibrationDueOn,
  calibrationOverdue,
  CALIBRATION_INTERVAL_RANGE,
  DEFAULT_CALIBRATION_INTERVAL_MONTHS,
} from './wrench-calibration.js';

describe('calibrationDueOn / calibrationOverdue', () => {
  it('runs out the same day after the interval (default 12 months [common practice])', () => {
    expect(DEFAULT_CALIBRATION_INTERVAL_MONTHS).toBe(12);
    expect(calibrationDueOn('2025-11-20', 12)).toBe('2026-11-20');
    expect(calibrationDueOn('2026-08-31', 6)).toBe('2027-02-28');
    expect(calibrationOverdue('2025-11-20', 12, '2026-11-19')).toBe(false);
    expect(calibrationOverdue('2025-11-20', 12, '2026-11-20')).toBe(true);
    expect(calibrationOverdue('2026-06-01', 3, '2026-12-02')).toBe(true);
    expect(calibrationOverdue('2026-06-01', 24, '2026-12-02')).toBe(false);
  });
  it('counts a wrench with no calibration recorded as overdue [decision]', () => {
    expect(calibrationOverdue(null, 12, '2026-12-02')).toBe(true);
  });
  it('refuses an interval outside the practice range and a day that is no date', () => {
    expect(() => calibrationDueOn('2026-01-01', CALIBRATION_INTERVAL_RANGE.max + 1)).toThrow(/whole number of months/);
    expect(() => calibrationDueOn('2026-01-01', 1.5)).toThrow(/whole number of months/);
    expect(() => calibrationOverdue('2026-01-01', 12, 'soon')).toThrow(/YYYY-MM-DD/);
  });
});
