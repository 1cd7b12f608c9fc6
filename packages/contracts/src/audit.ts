import { z } from 'zod';
import { Id, IsoDate, IsoDateTime } from './common.js';
import { AuditAction, AuditOutcome, Role } from './enums.js';
import type { RouteContract } from './route-contract.js';

/** Filters of the audit trail; `to` is inclusive (UTC days). */
const AuditFilters = z.object({
  patientId: Id.optional(),
  userId: Id.optional(),
  action: AuditAction.optional(),
  from: IsoDate.optional(),
  to: IsoDate.optional(),
});

/** A page: newest first, `before` the id of the last row of the previous page (keyset paging). */
export const AuditQuery = AuditFilters.extend({
  before: Id.optional(),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export type AuditQuery = z.infer<typeof AuditQuery>;
export const AuditCsvQuery = AuditFilters;
export type AuditCsvQuery = z.infer<typeof AuditCsvQuery>;
/** One patient's trail ("who accessed this record"): the same filters but the patient. */
export const PatientAuditQuery = AuditQuery.omit({ patientId: true });
export type PatientAuditQuery = z.infer<typeof PatientAuditQuery>;

export const AuditEvent = z.object({
  id: Id,
  at: IsoDateTime,
  action: AuditAction,
  outcome: AuditOutcome,
  httpStatus: z.number().int().nullable(),
  route: z.string().nullable(),
  recordType: z.string().nullable(),
  recordId: Id.nullable(),
  patientId: Id.nullable(),
  patientName: z.string().nullable(),
  chartNumber: z.string().nullable(),
  userId: Id.nullable(),
  userName: z.string().nullable(),
  role: Role.nullable(),
  address: z.string().nullable(),
  userAgent: z.string().nullable(),
  /** The filters of a list read. */
  query: z.record(z.string(), z.unknown()).nullable(),
  before: z.unknown(),
  after: z.unknown(),
});
export type AuditEvent = z.infer<typeof AuditEvent>;

export const AuditPage = z.object({
  items: z.array(AuditEvent),
  /** Pass as `before` for the next (older) page; null on the last page. */
  nextBefore: Id.nullable(),
});
export type AuditPage = z.infer<typeof AuditPage>;

/** The practice's trail, with its people for the user filter. */
export const PracticeAuditPage = AuditPage.extend({
  people: z.array(z.object({ id: Id, name: z.string(), role: Role })),
});
export type PracticeAuditPage = z.infer<typeof PracticeAuditPage>;

export const auditRoutes: RouteContract[] = [
  {
    method: 'get',
    path: '/audit',
    summary: "The practice's audit trail, newest first, filtered by patient, user, action and dates (practice admin)",
    signedIn: true,
    query: AuditQuery,
    reply: PracticeAuditPage,
  },
  {
    method: 'get',
    path: '/audit/csv',
    summary: 'The filtered audit trail as CSV, streamed (the export is audited too)',
    signedIn: true,
    query: AuditCsvQuery,
    produces: 'text/csv',
  },
  {
    method: 'get',
    path: '/patients/:id/audit',
    summary: "Who accessed this patient's record: their audit rows (dentist and practice admin)",
    signedIn: true,
    query: PatientAuditQuery,
    reply: AuditPage,
  },
];
