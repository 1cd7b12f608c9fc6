// The surgeon's issue, items 3–5: the lot look-up, how the implants do (a practice audit) and the
// referral summary sent to a share's surgeon.
import { z } from 'zod';
import { Id, IsoDate, IsoDateTime } from './common.js';
import {
  ComponentKind,
  ImplantOutcome,
  LotItemKind,
  LotLookupKind,
  OutcomeGrouping,
  PeriImplantStatus,
  Retention,
} from './enums.js';
import type { RouteContract } from './route-contract.js';

// ---- lot look-up ---------------------------------------------------------------------------

export const LotLookupQuery = z.strictObject({
  by: LotLookupKind,
  // A UDI may carry the GS separator; every other kind is printable text.
  q: z.string().trim().min(1, 'Enter what to look for').max(200, 'At most 200 characters'),
});
export type LotLookupQuery = z.infer<typeof LotLookupQuery>;

export const LotLookupRow = z.object({
  patientId: Id,
  chartNumber: z.string(),
  patientName: z.string(),
  siteId: Id,
  fdi: z.number().int(),
  item: LotItemKind,
  componentKind: ComponentKind.nullable(),
  /** Implant: system and platform; part: its name. */
  part: z.string(),
  referenceCode: z.string().nullable(),
  gtin: z.string().nullable(),
  lot: z.string().nullable(),
  installedOn: IsoDate,
  removedOn: IsoDate.nullable(),
  inPlace: z.boolean(),
});
export type LotLookupRow = z.infer<typeof LotLookupRow>;

export const LotLookupReply = z.object({
  by: LotLookupKind,
  /** What was searched for: for a UDI, the GTIN and lot read from it. */
  gtin: z.string().nullable(),
  lot: z.string().nullable(),
  part: z.string().nullable(),
  rows: z.array(LotLookupRow),
});
export type LotLookupReply = z.infer<typeof LotLookupReply>;

// ---- how the implants do -------------------------------------------------------------------

/**
 * The curves and the complication rate count every implant in scope; the list of implants comes a
 * page at a time, in placement order (a large practice has tens of thousands).
 */
export const OutcomesQuery = z.strictObject({
  groupBy: OutcomeGrouping.default('system'),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export type OutcomesQuery = z.infer<typeof OutcomesQuery>;

export const OutcomeImplant = z.object({
  siteId: Id,
  patientId: Id,
  chartNumber: z.string(),
  fdi: z.number().int(),
  placedOn: IsoDate,
  system: z.string(),
  retention: Retention.nullable(),
  outcome: ImplantOutcome,
  endedOn: IsoDate.nullable(),
  followUpYears: z.number().nullable(),
  periImplantStatus: PeriImplantStatus.nullable(),
  periImplantOn: IsoDate.nullable(),
  /** Latest bone level minus the reference reading (closest to loading, else first after); positive = bone lost. */
  boneChangeMm: z.number().nullable(),
  /** The date of the reference reading. */
  boneChangeSince: IsoDate.nullable(),
  complications: z.number().int(),
});
export type OutcomeImplant = z.infer<typeof OutcomeImplant>;

export const SurvivalStep = z.object({
  years: z.number(),
  atRisk: z.number().int(),
  events: z.number().int(),
  censored: z.number().int(),
  survival: z.number(),
  standardError: z.number().nullable(),
});
export const SurvivalCurve = z.object({
  /** System name, or a retention (null: not restored yet). */
  group: z.string().nullable(),
  subjects: z.number().int(),
  events: z.number().int(),
  steps: z.array(SurvivalStep),
  /** Number at risk at whole years 0, 1, 2 … for the row under the axis. */
  atRiskByYear: z.array(z.number().int()),
});
export type SurvivalCurve = z.infer<typeof SurvivalCurve>;

export const OutcomesReply = z.object({
  asOf: IsoDate,
  groupBy: OutcomeGrouping,
  /** This page of the implants in scope, oldest placement first. */
  implants: z.array(OutcomeImplant),
  /** Every implant in scope: what the curves and the complication rate count. */
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
  curves: z.array(SurvivalCurve),
  /** Failed or removed implants without an end date: left out of the curves. */
  withoutEndDate: z.number().int(),
  complications: z.object({
    events: z.number().int(),
    implantYears: z.number(),
    per100ImplantYears: z.number().nullable(),
  }),
});
export type OutcomesReply = z.infer<typeof OutcomesReply>;

// ---- referral summary ----------------------------------------------------------------------
export const ReferralSummaryMailBody = z.strictObject({
  shareId: Id,
  /** Made once per press by the client: the same key twice is the same request (sent once). */
  idempotencyKey: Id,
});
export type ReferralSummaryMailBody = z.infer<typeof ReferralSummaryMailBody>;

export const ReferralSummaryMail = z.object({
  id: Id,
  shareId: Id,
  /** Left out of a share's reply. */
  sentTo: z.string().optional(),
  status: z.enum(['pending', 'sent', 'failed']),
  attempts: z.number().int(),
  requestedAt: IsoDateTime,
  sentAt: IsoDateTime.nullable(),
});
export type ReferralSummaryMail = z.infer<typeof ReferralSummaryMail>;

export const ReferralRecipient = z.object({
  shareId: Id,
  surgeonName: z.string(),
  practiceName: z.string(),
});
export const ReferralSummaryState = z.object({
  recipients: z.array(ReferralRecipient),
  mails: z.array(ReferralSummaryMail),
});
export type ReferralSummaryState = z.infer<typeof ReferralSummaryState>;

export const outcomeRoutes: RouteContract[] = [
  {
    method: 'get',
    path: '/lot-lookup',
    summary: 'Which patients received an implant or part of a lot, GTIN, catalogue part or pasted UDI',
    signedIn: true,
    query: LotLookupQuery,
    reply: LotLookupReply,
  },
  {
    method: 'get',
    path: '/lot-lookup/csv',
    summary: 'The lot look-up as CSV (audited as an export)',
    signedIn: true,
    query: LotLookupQuery,
    produces: 'text/csv',
  },
  {
    method: 'get',
    path: '/outcomes',
    summary:
      'How the implants do (practice audit): implants with status, survival curves (Kaplan–Meier) and complications per 100 implant-years',
    signedIn: true,
    query: OutcomesQuery,
    reply: OutcomesReply,
  },
  {
    method: 'get',
    path: '/patients/:id/referral-summary',
    summary: "The patient's referral summary: whom it can be sent to, and the mails sent so far",
    signedIn: true,
    reply: ReferralSummaryState,
  },
  {
    method: 'get',
    path: '/patients/:id/referral-summary/pdf',
    summary: "Download the patient's referral summary (placement, restoration, last recall, bone-level trend)",
    signedIn: true,
    produces: 'application/pdf',
  },
  {
    method: 'post',
    path: '/patients/:id/referral-summary/mails',
    summary: "E-mail the referral summary to a share's surgeon through the job queue (same key twice: sent once)",
    signedIn: true,
    body: ReferralSummaryMailBody,
    reply: ReferralSummaryMail,
  },
];
