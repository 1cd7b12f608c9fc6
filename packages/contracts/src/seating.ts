// Seating confirmation: a radiograph attached to a restoration's delivery or impression as the
// check that the parts are seated. Amended with a reason, never overwritten.
import { z } from 'zod';
import { Id, IsoDate, IsoDateTime, NoteText } from './common.js';
import { SEATING_ANSWERS, SEATING_EVENTS, SeatingAnswer, SeatingEvent } from './enums.js';
import { keepingOmitted } from './amendment.js';
import type { RouteContract } from './route-contract.js';

const note = NoteText(1000)
  .nullable()
  .default(null)
  .transform((s) => (s ? s : null));

export const SeatingCheckBody = z.object({
  event: z.enum(SEATING_EVENTS, { error: 'Choose the delivery or the impression' }),
  radiographId: z.uuid({ error: 'Choose the radiograph that shows the seating' }),
  seated: z.enum(SEATING_ANSWERS, { error: 'Say whether the parts are seated: yes, no or unsure' }),
  note,
});
export type SeatingCheckBody = z.input<typeof SeatingCheckBody>;

/** A new version: a field left out keeps its value, `null` clears the note. */
export const SeatingAmendmentBody = z.object({
  ...keepingOmitted(SeatingCheckBody.omit({ event: true }).shape),
  reason: NoteText(500).min(3, 'Say why the seating check is amended (at least 3 characters)'),
});
export type SeatingAmendmentBody = z.input<typeof SeatingAmendmentBody>;

export const SeatingCheck = z.object({
  id: Id,
  restorationId: Id,
  event: SeatingEvent,
  radiographId: Id,
  radiographTakenOn: IsoDate.nullable(),
  /** The radiograph was marked entered in error after the check: the check no longer rests on it. */
  radiographEnteredInError: z.boolean(),
  seated: SeatingAnswer,
  /** Left out of a share's reply. */
  note: z.string().nullable().optional(),
  recordedBy: z.string().optional(),
  recordedAt: IsoDateTime,
  supersedesId: Id.nullable(),
  amendmentReason: z.string().nullable().optional(),
  /** False once a newer version supersedes this one. */
  current: z.boolean(),
});
export type SeatingCheck = z.infer<typeof SeatingCheck>;

export const SeatingCheckListReply = z.object({ items: z.array(SeatingCheck) });
export type SeatingCheckListReply = z.infer<typeof SeatingCheckListReply>;

/** The Stack's answer for a delivered restoration; null there means "not checked radiographically". */
export const SeatingSummary = z.object({
  checkId: Id,
  seated: SeatingAnswer,
  radiographId: Id,
  radiographTakenOn: IsoDate.nullable(),
  radiographEnteredInError: z.boolean(),
  recordedAt: IsoDateTime,
});
export type SeatingSummary = z.infer<typeof SeatingSummary>;

const r = (method: RouteContract['method'], path: string, summary: string, more: Partial<RouteContract> = {}) =>
  ({ method, path, summary, signedIn: true, ...more }) satisfies RouteContract;

export const seatingRoutes: RouteContract[] = [
  r('get', '/restorations/:id/seating-checks', "Every seating check of a restoration's delivery and impression", {
    reply: SeatingCheckListReply,
  }),
  r(
    'post',
    '/restorations/:id/seating-checks',
    "Confirm seating at the delivery or impression on one of the patient's radiographs (dentist)",
    { body: SeatingCheckBody, reply: SeatingCheck },
  ),
  r('post', '/seating-checks/:id/amendments', 'Amend a seating check: a new version superseding it, with the reason', {
    body: SeatingAmendmentBody,
    reply: SeatingCheck,
  }),
];
