import { sql } from 'drizzle-orm';
import { auditValues, currentAudit, type AuditEventValues } from '../common/audit-context.js';
import type { Database, Db, Tx } from './database.js';
import { preparedFor } from './prepared.js';
import { auditEvents } from './schema/index.js';

/**
 * Inserts one audit row. The practice and role come from the user when the caller knows only who
 * (a sign-out, a failed sign-in of a known e-mail).
 */
export async function insertAuditEvent(db: Db, values: AuditEventValues, at?: Date): Promise<void> {
  const { userId } = values;
  await db.insert(auditEvents).values({
    ...values,
    ...(at ? { at } : {}),
    practiceId: values.practiceId ?? (userId ? sql`(select practice_id from users where id = ${userId})` : null),
    role: values.role ?? (userId ? sql`(select role from users where id = ${userId})` : null),
  });
}

const placeholder = (name: keyof AuditEventValues) => sql.placeholder(name);

/**
 * `insertAuditEvent` as a named statement, for the row every audited read writes on its own
 * (audit/audit-recorder.ts): built once, parsed and planned once per connection. The same row as
 * `insertAuditEvent` without `at`, the fallbacks to the user's practice and role included.
 */
const auditInsertQuery = preparedFor((db) =>
  db
    .insert(auditEvents)
    .values({
      practiceId: sql`coalesce(${placeholder('practiceId')}::uuid, (select practice_id from users where id = ${placeholder('userId')}::uuid))`,
      userId: placeholder('userId'),
      role: sql`coalesce(${placeholder('role')}::role, (select role from users where id = ${placeholder('userId')}::uuid))`,
      action: placeholder('action'),
      outcome: placeholder('outcome'),
      httpStatus: placeholder('httpStatus'),
      route: placeholder('route'),
      recordType: placeholder('recordType'),
      recordId: placeholder('recordId'),
      patientId: placeholder('patientId'),
      query: placeholder('query'),
      before: placeholder('before'),
      after: placeholder('after'),
      address: placeholder('address'),
      userAgent: placeholder('userAgent'),
      requestId: placeholder('requestId'),
    })
    .prepare('audit_insert'),
);

/** One audit row outside any transaction (a read's, a refusal's), as a named statement. */
export async function recordAuditEvent(db: Database, values: AuditEventValues): Promise<void> {
  await auditInsertQuery(db).execute({ ...values });
}

/**
 * The transaction every service write uses instead of `db.transaction` (issue 11): after `fn`,
 * still inside the same transaction, it writes the request's audit row from what the request
 * opened and reported (common/audit-context.ts). A write that commits has its row; a write that
 * rolls back takes its row with it, and the audit interceptor then records the refusal or
 * failure outside. Outside a request (seed, jobs) it is a plain transaction.
 */
export function auditedTransaction<T>(db: Database, fn: (tx: Tx) => Promise<T>): Promise<T> {
  return db.transaction(async (tx) => {
    const result = await fn(tx);
    const context = currentAudit();
    if (context && !context.written) {
      await insertAuditEvent(tx, auditValues(context, 'allowed', context.plan.successStatus));
      context.written = true;
    }
    return result;
  });
}
