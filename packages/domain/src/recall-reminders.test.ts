// Reminder windows: practice policy, 14 days before and 7 days after by default [common practice].
// Moved from the API's recall tests with the rule.
import { describe, expect, it } from 'vitest';
import { DEFAULT_OVERDUE_REMINDER_DAYS_AFTER, DEFAULT_REMINDER_DAYS_BEFORE, remindersDue } from './recall-reminders.js';

describe('reminder windows (practice policy)', () => {
  const policy = { reminderDaysBefore: 14, overdueReminderDaysAfter: 7 };
  it('sends the upcoming reminder from 14 days before until the day itself', () => {
    expect(remindersDue('2026-06-15', '2026-05-31', policy)).toEqual([]);
    expect(remindersDue('2026-06-15', '2026-06-01', policy)).toEqual(['upcoming']);
    expect(remindersDue('2026-06-15', '2026-06-15', policy)).toEqual(['upcoming']);
  });
  it('sends the overdue reminder from 7 days after', () => {
    expect(remindersDue('2026-06-15', '2026-06-21', policy)).toEqual([]);
    expect(remindersDue('2026-06-15', '2026-06-22', policy)).toEqual(['overdue']);
    expect(remindersDue('2026-06-15', '2027-01-01', policy)).toEqual(['overdue']);
  });
  it('an overdue window of 0 days still starts the day after the recall, not on it', () => {
    expect(remindersDue('2026-06-15', '2026-06-15', { reminderDaysBefore: 0, overdueReminderDaysAfter: 0 })).toEqual([
      'upcoming',
    ]);
    expect(remindersDue('2026-06-15', '2026-06-16', { reminderDaysBefore: 0, overdueReminderDaysAfter: 0 })).toEqual([
      'overdue',
    ]);
  });
  it('defaults are 14 days before and 7 days after [common practice]', () => {
    expect([DEFAULT_REMINDER_DAYS_BEFORE, DEFAULT_OVERDUE_REMINDER_DAYS_AFTER]).toEqual([14, 7]);
  });
});
