// Shares: a patient of one practice opened to a referring surgeon of another, with a scope, the
// sites it covers, an optional end date and a reason; revoked at any time, never deleted.
import { z } from 'zod';
import { EmailAddress, FdiPosition, Id, IsoDate, IsoDateTime, PlainText } from './common.js';
import { ShareScope, ShareStatus } from './enums.js';
import type { RouteContract } from './route-contract.js';

export const Share = z.object({
  id: Id,
  patientId: Id,
  patientName: z.string(),
  chartNumber: z.string(),
  /** An invited surgeon has only the address until they accept (then their account and practice). */
  surgeon: z.object({
    id: Id.nullable(),
    displayName: z.string().nullable(),
    email: z.string(),
    practiceName: z.string().nullable(),
  }),
  /** While invited: when the invitation's link stops working (null until its mail is sent). */
  invitationExpiresAt: IsoDateTime.nullable(),
  scopes: z.array(ShareScope),
  /** The shared implant sites; null: every implant site of the patient, also those added later. */
  sites: z.array(z.object({ id: Id, fdi: FdiPosition })).nullable(),
  /** The last day the share is open (inclusive); null: until revoked. */
  endsOn: IsoDate.nullable(),
  reason: z.string(),
  status: ShareStatus,
  sharedByName: z.string(),
  since: IsoDateTime,
  revokedAt: IsoDateTime.nullable(),
  revokedByName: z.string().nullable(),
  revokeReason: z.string().nullable(),
});
export type Share = z.infer<typeof Share>;

export const ShareListReply = z.object({ items: z.array(Share) });
export type ShareListReply = z.infer<typeof ShareListReply>;

export const CreateShareBody = z.object({
  /**
   * The surgeon's e-mail, exactly: other practices' users are never listed. An address with no
   * account is invited (a one-time link to sign up with a practice of their own).
   */
  surgeonEmail: EmailAddress,
  scopes: z
    .array(ShareScope)
    .min(1, { error: 'Choose what the surgeon may do: placement, outcomes or both' })
    .refine((s) => new Set(s).size === s.length, { error: 'Name each scope once' }),
  /** Chosen implant sites of the patient; null: all of them. */
  siteIds: z
    .array(Id)
    .min(1, { error: 'Choose at least one implant site, or share all of them' })
    .max(32, { error: 'A patient has at most 32 sites' })
    .nullable(),
  /** The last day the share is open; today or later. */
  endsOn: IsoDate.nullable(),
  reason: PlainText(500)
    .trim()
    .min(1, { error: 'Say why the patient is shared, e.g. "Referred for the implant at 36"' }),
});
export type CreateShareBody = z.input<typeof CreateShareBody>;

export const RevokeShareBody = z.object({
  reason: PlainText(500).trim().min(1, { error: 'Say why the share ends' }),
});
export type RevokeShareBody = z.infer<typeof RevokeShareBody>;

export const shareRoutes: RouteContract[] = [
  {
    method: 'get',
    path: '/shares',
    summary: "The practice's shares with surgeons of other practices, active, ended and revoked",
    signedIn: true,
    reply: ShareListReply,
  },
  {
    method: 'get',
    path: '/patients/:id/shares',
    summary: "One patient's shares",
    signedIn: true,
    reply: ShareListReply,
  },
  {
    method: 'post',
    path: '/patients/:id/shares',
    summary:
      'Share the patient with a surgeon of another practice, found by exact e-mail (or invited when the address has no account); the surgeon is e-mailed',
    signedIn: true,
    body: CreateShareBody,
    reply: Share,
  },
  {
    method: 'post',
    path: '/shares/:id/revoke',
    summary: 'Revoke a share at once; the surgeon is e-mailed',
    signedIn: true,
    status: 200,
    body: RevokeShareBody,
    reply: Share,
  },
];
