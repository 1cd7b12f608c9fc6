// Pure helpers of the recall module that are not clinical rules: the reminder's idempotency key. The clinical parts — which exam is the baseline, how an exam reaches
// classifyPeriImplant, when reminders are due — live in packages/domain.
import type { ReminderKind } from '@torquetrail/domain';

export const reminderKey = (patientId: string, dueOn: string, kind: ReminderKind) =>
  `recall-reminder:${patientId}:${dueOn}:${kind}`;
