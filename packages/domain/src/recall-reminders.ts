/**
 * When recall reminders are sent, under the practice's reminder policy.
 *
 * No published rule fixes reminder timing: 14 days before the recall and 7 days after a missed one
 * are practice defaults [common practice], editable by the practice admin. Pure calendar arithmetic
 * on YYYY-MM-DD dates, as for the recall date itself ({@link nextRecallDate}).
 */
import { daysBetween } from './calendar.js';
import type { ReminderKind } from './choices.js';

/** Default: the upcoming reminder goes this many days before the recall [common practice]. */
export const DEFAULT_REMINDER_DAYS_BEFORE = 14;
/** Default: the overdue reminder goes this many days after a missed recall [common practice]. */
export const DEFAULT_OVERDUE_REMINDER_DAYS_AFTER = 7;

/** The reminder part of a practice's recall policy, whole days. */
export interface ReminderPolicy {
  reminderDaysBefore: number;
  overdueReminderDaysAfter: number;
}

/**
 * Reminder kinds due on `today` for a recall due on `dueOn`: 'upcoming' from `reminderDaysBefore`
 * days before until the day itself, 'overdue' from `overdueReminderDaysAfter` days after (and at
 * least one day after). A daily scan sends each kind once (the API keeps an idempotency key).
 * @throws ValidationError for an impossible date
 */
export function remindersDue(dueOn: string, today: string, policy: ReminderPolicy): ReminderKind[] {
  const until = daysBetween(today, dueOn);
  const kinds: ReminderKind[] = [];
  if (until >= 0 && until <= policy.reminderDaysBefore) kinds.push('upcoming');
  if (-until >= policy.overdueReminderDaysAfter && until < 0) kinds.push('overdue');
  return kinds;
}
