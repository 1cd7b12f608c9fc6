// Pure helpers of the recall module that are not clinical rules: CSV quoting and the reminder's
// idempotency key. The clinical parts — which exam is the baseline, how an exam reaches
// classifyPeriImplant, when reminders are due — live in packages/domain.
import type { ReminderKind } from '@torquetrail/domain';

/** RFC 4180 field quoting; a leading = + - @ is prefixed with ' so spreadsheets do not run it as a formula. */
export function csvField(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return '';
  let text = String(value);
  if (/^[=+\-@\t\r]/.test(text) && typeof value === 'string') text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function csvLine(fields: (string | number | null | undefined)[]): string {
  return `${fields.map(csvField).join(',')}\r\n`;
}

export const reminderKey = (patientId: string, dueOn: string, kind: ReminderKind) =>
  `recall-reminder:${patientId}:${dueOn}:${kind}`;
