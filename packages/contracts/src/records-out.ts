// Records that leave the practice: the FHIR R4 export, the implant passport and the retrieval card.
import { z } from 'zod';
import { Id } from './common.js';
import { ReminderStatus } from './enums.js';
import type { RouteContract } from './route-contract.js';

/** A request to e-mail the passport to the patient: nothing to choose, the address is the patient's own. */
export const PassportMailBody = z.strictObject({});
export type PassportMailBody = z.infer<typeof PassportMailBody>;

export const PassportMail = z.object({
  id: Id,
  sentTo: z.string(),
  status: ReminderStatus,
  requestedAt: z.string(),
  sentAt: z.string().nullable(),
});
export type PassportMail = z.infer<typeof PassportMail>;

/** What the patient screen needs to offer the records: may the passport be e-mailed, and the last requests. */
export const RecordsOutStatus = z.object({
  /** Null when e-mailing is possible; otherwise the reason, in words for the button. */
  emailBlockedReason: z.string().nullable(),
  mails: z.array(PassportMail),
});
export type RecordsOutStatus = z.infer<typeof RecordsOutStatus>;

const r = (
  method: RouteContract['method'],
  path: string,
  summary: string,
  extra: Partial<RouteContract> = {},
): RouteContract => ({ method, path, summary, signedIn: true, ...extra });

export const recordsOutRoutes: RouteContract[] = [
  r(
    'get',
    '/patients/:id/fhir',
    "The patient's implant record as a FHIR R4 Bundle (type collection); audited as an export",
    {
      produces: 'application/fhir+json',
    },
  ),
  r('get', '/patients/:id/passport.pdf', "The patient's implant passport (PDF, plain language); audited as an export", {
    produces: 'application/pdf',
  }),
  r(
    'get',
    '/patients/:id/retrieval-card.pdf',
    'The retrieval card: one page per restored site (PDF); audited as an export',
    {
      produces: 'application/pdf',
    },
  ),
  r(
    'get',
    '/patients/:id/passport/mails',
    'Whether the passport may be e-mailed to the patient, and the latest requests',
    {
      reply: RecordsOutStatus,
    },
  ),
  r(
    'post',
    '/patients/:id/passport/mails',
    "E-mail the passport to the patient's own address (needs their e-mail consent); sent by the job queue",
    { body: PassportMailBody, reply: PassportMail },
  ),
];
