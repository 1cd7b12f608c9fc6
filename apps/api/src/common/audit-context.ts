// What one request's audit row will say, gathered while the request runs (issue 11). The audit
// interceptor opens the context around the handler; the row-level checks (`assertCan`) note which
// records and patient were opened, services report what they changed, and the row is written by
// `auditedTransaction` (db/audited-transaction.ts) inside the write's own transaction, or by the
// interceptor for reads and refusals. Nothing here writes: this is the request's notebook.
import { AsyncLocalStorage } from 'node:async_hooks';
import type { Role } from '@torquetrail/authz';
import type { AuditAction, AuditOutcome } from '@torquetrail/contracts';

/** What a route's audit row is, decided once from its declarations (audit/audit-plan.ts). */
export interface AuditPlan {
  action: AuditAction;
  /** The record type named when no row was opened or reported (the route's @Allow subject). */
  recordType: string | null;
  /** `GET /sites/:id`: the route as declared, never the URL with its ids and query string. */
  route: string;
  /** The status a success answers with (201 for a POST unless the route says otherwise). */
  successStatus: number;
  /** A write declared by @Allow: its row belongs in its transaction (auditedTransaction). */
  inTransaction: boolean;
}

export interface AuditActor {
  userId: string;
  role?: Role;
  practiceId?: string;
}

interface OpenedRecord {
  type: string;
  id?: string;
  patientId?: string;
  practiceId?: string;
}

/** What a service reports about its change: which record, and its state before and after. */
export interface AuditChange {
  type: string;
  id?: string;
  patientId?: string;
  before?: unknown;
  after?: unknown;
}

export interface AuditContext {
  plan: AuditPlan;
  actor: AuditActor | null;
  address: string | null;
  userAgent: string | null;
  requestId: string | null;
  /** The parsed query of a list read (its filters), or null. */
  query: Record<string, unknown> | null;
  opened: OpenedRecord[];
  change: AuditChange | null;
  /** Set once the row is written, so a request never writes two success rows. */
  written: boolean;
}

/** The row as inserted into audit_events (db/audit-events.ts). */
export interface AuditEventValues {
  practiceId: string | null;
  userId: string | null;
  role: Role | null;
  action: AuditAction;
  outcome: AuditOutcome;
  httpStatus: number;
  route: string;
  recordType: string | null;
  recordId: string | null;
  patientId: string | null;
  query: Record<string, unknown> | null;
  before: unknown;
  after: unknown;
  address: string | null;
  userAgent: string | null;
  requestId: string | null;
}

const storage = new AsyncLocalStorage<AuditContext>();

export const currentAudit = (): AuditContext | undefined => storage.getStore();

export function runInAudit<T>(context: AuditContext, fn: () => T): T {
  return storage.run(context, fn);
}

/** Called by `assertCan` for every row it lets through: the records (and patient) a request opened. */
export function noteOpened(type: string, row: { id?: string; patientId?: string; practiceId?: string }): void {
  const context = storage.getStore();
  if (!context || context.opened.length >= 20) return;
  context.opened.push({
    type,
    id: row.id,
    patientId: type === 'Patient' ? row.id : row.patientId,
    practiceId: row.practiceId,
  });
}

/** A service names the record it changed, with its state before and after (called inside the transaction). */
export function reportChange(change: AuditChange): void {
  const context = storage.getStore();
  if (context) context.change = { ...context.change, ...change };
}

/** Who the request turned out to be, when no session said so (sign-in, sign-out). */
export function reportActor(actor: AuditActor | null): void {
  const context = storage.getStore();
  if (context && actor) context.actor = actor;
}

/**
 * A plain JSON copy: Express's query objects have no prototype, and dates become ISO text. A lone
 * surrogate becomes U+FFFD, as it does in a text column: jsonb refuses its escape.
 */
const asJson = <T>(value: T): T | null =>
  value === undefined || value === null
    ? null
    : (JSON.parse(JSON.stringify(value), (_key, v: unknown) =>
        typeof v === 'string' ? v.replace(/\p{Cs}/gu, '\uFFFD') : v,
      ) as T);

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const uuidOrNull = (value: string | undefined) => (value && UUID.test(value) ? value : null);

/** The audit row a context describes, with the request's outcome. */
export function auditValues(context: AuditContext, outcome: AuditOutcome, httpStatus: number): AuditEventValues {
  const { plan, change, actor } = context;
  const first = context.opened[0];
  const ofPatient = context.opened.find((r) => r.patientId);
  const patientId = change?.patientId ?? ofPatient?.patientId;
  // The record: what the service reported; else the first row opened (a read, or the row amended).
  const record = change ?? (first && (plan.action !== 'create' || first.type === plan.recordType) ? first : null);
  return {
    // The practice whose record it is (a surgeon's read of a shared patient is in the patient's
    // practice's trail, where "who accessed this record" finds it); else the actor's own.
    practiceId: ofPatient?.practiceId ?? actor?.practiceId ?? null,
    userId: actor?.userId ?? null,
    role: actor?.role ?? null,
    action: outcome === 'allowed' || plan.action !== 'sign-in' ? plan.action : 'sign-in-failed',
    outcome,
    httpStatus,
    route: plan.route,
    recordType: record?.type ?? plan.recordType,
    recordId: uuidOrNull(record?.id),
    patientId: uuidOrNull(patientId),
    query: asJson(context.query),
    before: asJson(change?.before),
    after: asJson(change?.after),
    address: context.address,
    userAgent: context.userAgent,
    requestId: context.requestId,
  };
}
