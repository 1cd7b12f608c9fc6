// What each route must leave in the audit trail (issue 11), one entry per route of
// packages/contracts/src/routes.ts: a test fails for a route without an entry, so a new route
// must say whether it is audited. The route × actor matrix checks every call it makes against
// this table by the call's request id (expectAuditRows).
import { sql } from 'drizzle-orm';
import type { AuditAction } from '@torquetrail/contracts';
import { expect } from 'vitest';
import type { TestContext } from './test-app.js';

interface Audited {
  action: AuditAction;
  /** An allowed call names the patient whose data it read or changed. */
  patient: boolean;
}
const read = (patient = true): Audited => ({ action: 'read', patient });
const create: Audited = { action: 'create', patient: true };
const amend: Audited = { action: 'amend', patient: true };
const catalogue: Audited = { action: 'catalogue-change', patient: false };

/** null: not audited (no patient data, no change). */
export const AUDIT_EXPECTATIONS: Record<string, Audited | null> = {
  'GET /api/health': null,
  'GET /api/health/ready': null,
  'GET /api/health/live': null,
  'POST /api/auth/sign-in': { action: 'sign-in', patient: false },
  'POST /api/auth/sign-out': { action: 'sign-out', patient: false },
  'GET /api/auth/me': null,
  'GET /api/patients': read(false),
  'GET /api/patients/:id': read(),
  'GET /api/sites/:id': read(),
  'GET /api/catalogue': null,
  'POST /api/catalogue/systems': catalogue,
  'PATCH /api/catalogue/systems/:id': catalogue,
  'POST /api/catalogue/platforms': catalogue,
  'PATCH /api/catalogue/platforms/:id': catalogue,
  'POST /api/catalogue/components': catalogue,
  'PATCH /api/catalogue/components/:id': catalogue,
  'GET /api/catalogue/components/:id/versions': null,
  'GET /api/wrenches': null,
  'POST /api/wrenches': catalogue,
  'PATCH /api/wrenches/:id': catalogue,
  'GET /api/wrenches/:id/calibrations': null,
  'POST /api/wrenches/:id/calibrations': catalogue,
  'GET /api/patients/:id/restorable-sites': read(),
  'GET /api/patients/:id/restorations': read(),
  'POST /api/restorations': create,
  'GET /api/restorations/:id': read(),
  'POST /api/restorations/:id/amendments': amend,
  'POST /api/restorations/:id/delivery': create,
  'POST /api/restorations/:id/lab-prescriptions': create,
  'GET /api/lab-prescriptions/:id/pdf': { action: 'export', patient: true },
  'POST /api/torque-events': create,
  'POST /api/torque-events/:id/amendments': amend,
  'GET /api/restorations/:id/screws': read(),
  'POST /api/restorations/:id/seat': create,
  'POST /api/complications': create,
  'POST /api/complications/:id/amendments': amend,
  'POST /api/insert-changes': create,
  'POST /api/insert-changes/:id/amendments': amend,
  'GET /api/practice/insert-review-settings': null,
  'PUT /api/practice/insert-review-settings': { action: 'policy-change', patient: false },
  'GET /api/sites/:id/timeline': read(),
  'GET /api/recalls/desk': read(false),
  'GET /api/recalls/desk/csv': { action: 'export', patient: false },
  'GET /api/lot-lookup': read(false),
  'GET /api/lot-lookup/csv': { action: 'export', patient: false },
  'GET /api/outcomes': read(false),
  'GET /api/patients/:id/referral-summary': read(),
  'GET /api/patients/:id/referral-summary/pdf': { action: 'export', patient: true },
  'POST /api/patients/:id/referral-summary/mails': create,
  'GET /api/recalls/patients/:id/exam-context': read(),
  'POST /api/recalls/visits': create,
  'POST /api/recalls/exams/:id/amend': amend,
  'GET /api/recalls/sites/:id/exams': read(),
  'GET /api/recalls/policy': null,
  'PUT /api/recalls/policy': { action: 'policy-change', patient: false },
  'POST /api/recalls/reminders/run': { action: 'create', patient: false },
  'GET /api/recalls/reminders': read(false),
  'POST /api/patients/:id/radiographs': create,
  'GET /api/patients/:id/radiographs': read(),
  'GET /api/radiographs/:id': read(),
  'GET /api/radiographs/:id/original': { action: 'export', patient: true },
  'GET /api/radiographs/:id/preview': read(),
  'GET /api/radiographs/:id/thumbnail': read(),
  'POST /api/radiographs/:id/entered-in-error': amend,
  'POST /api/radiographs/:id/measurements': create,
  'POST /api/radiograph-measurements/:id/amendments': amend,
  'POST /api/patients/:id/sites': create,
  'GET /api/sites/:id/placement-options': read(),
  'POST /api/sites/:id/placements': create,
  'POST /api/placements/:id/amendments': amend,
  'GET /api/audit': read(false),
  'GET /api/audit/csv': { action: 'export', patient: false },
  'GET /api/patients/:id/audit': read(),
  'GET /api/sites/:id/bone-levels': read(),
  'POST /api/patients': create,
  'PATCH /api/patients/:id': amend,
  'POST /api/patients/:id/archive': { action: 'archive', patient: true },
  'POST /api/patients/:id/unarchive': { action: 'archive', patient: true },
  'GET /api/patients/:id/versions': read(),
  'GET /api/patients/duplicates': read(false),
  'GET /api/practice/patient-settings': null,
  'PUT /api/practice/patient-settings': { action: 'policy-change', patient: false },
  'GET /api/restorations/:id/seating-checks': read(),
  'POST /api/restorations/:id/seating-checks': create,
  'POST /api/seating-checks/:id/amendments': amend,
  'GET /api/restorations/:id/impressions': read(),
  'POST /api/restorations/:id/impressions': create,
  'POST /api/impressions/:id/amendments': amend,
  'POST /api/impressions/:id/scan-files': create,
  'GET /api/scan-files/:id/file': { action: 'export', patient: true },
  'GET /api/scan-files/:id/markers': read(),
  'POST /api/scan-files/:id/markers': create,
  // No session: a download through a valid link writes its own 'export' row in the service
  // (impression-lab.e2e-spec.ts); a refused link names no one and no patient.
  'GET /api/lab-files/:token': null,
  'GET /api/people': null,
  'POST /api/people/invitations': { action: 'invite', patient: false },
  'POST /api/people/invitations/:id/resend': { action: 'invite', patient: false },
  'POST /api/people/invitations/:id/revoke': { action: 'role-change', patient: false },
  'PUT /api/people/:id/role': { action: 'role-change', patient: false },
  'POST /api/people/:id/deactivation': { action: 'role-change', patient: false },
  'GET /api/practice/session-settings': null,
  'PUT /api/practice/session-settings': { action: 'policy-change', patient: false },
  'PUT /api/practice/wrench-settings': { action: 'policy-change', patient: false },
  'GET /api/practice/impression-settings': null,
  'PUT /api/practice/impression-settings': { action: 'policy-change', patient: false },
  'GET /api/practice/cantilever-settings': null,
  'PUT /api/practice/cantilever-settings': { action: 'policy-change', patient: false },
  'GET /api/practice/contact': null,
  'PUT /api/practice/contact': { action: 'policy-change', patient: false },
  // Shares (issue 12): the list names patients; every change is a share-change naming its patient.
  'GET /api/shares': read(false),
  'GET /api/patients/:id/shares': read(),
  'POST /api/patients/:id/shares': { action: 'share-change', patient: true },
  'POST /api/shares/:id/revoke': { action: 'share-change', patient: true },
  // The public link pages and one's own password: no patient data, no record of the practice's.
  'POST /api/account/invitation': null,
  'POST /api/account/invitation/accept': null,
  'POST /api/account/password-reset': null,
  'POST /api/account/password-reset/look-up': null,
  'POST /api/account/password-reset/complete': null,
  'PUT /api/auth/password': null,
  'GET /api/patients/:id/fhir': { action: 'export', patient: true },
  'GET /api/patients/:id/passport.pdf': { action: 'export', patient: true },
  'GET /api/patients/:id/retrieval-card.pdf': { action: 'export', patient: true },
  'GET /api/patients/:id/passport/mails': read(),
  'POST /api/patients/:id/passport/mails': create,
  // The dry run reads the patient data of a file, of no one patient; the import creates records of many.
  'POST /api/imports/dry-run': read(false),
  'POST /api/imports': { action: 'create', patient: false },
  'GET /api/imports/progress/:runId': null,
};

/**
 * Tables of the records a write names, to prove its audit row was written in the write's own
 * transaction: both rows carry the same xmin. Writes naming no such record (a policy, a scan) are
 * listed in NOT_A_ROW.
 */
const RECORD_TABLES: Record<string, string> = {
  Patient: 'patients',
  Share: 'patient_shares',
  ImplantSite: 'implant_sites',
  Placement: 'placements',
  Restoration: 'restorations',
  TorqueEvent: 'torque_events',
  Complication: 'complications',
  InsertChange: 'insert_changes',
  RecallExam: 'recall_exams',
  Radiograph: 'radiographs',
  RadiographMeasurement: 'radiograph_measurements',
  SeatingCheck: 'seating_checks',
  Impression: 'impressions',
  ScanFile: 'scan_files',
  ScanBodyMarker: 'scan_body_markers',
  LabPrescription: 'lab_prescriptions',
  ReferralSummaryMail: 'referral_summary_mails',
  PassportMail: 'passport_mails',
  CatalogueSystem: 'implant_systems',
  CataloguePlatform: 'platforms',
  CatalogueComponent: 'components',
  Wrench: 'torque_wrenches',
  WrenchCalibration: 'wrench_calibrations',
  LegacyImport: 'legacy_imports',
};
const NOT_A_ROW = new Set(['RecallPolicy', 'Practice', 'Reminder', 'User', 'ImportDryRun']);

type Row = {
  action: string;
  outcome: string;
  http_status: number;
  route: string;
  email: string | null;
  record_type: string | null;
  record_id: string | null;
  patient_id: string | null;
  xmin: string;
};

let checked = 0;
/** How many calls had their audit rows checked (for the figures line). */
export const auditChecks = () => checked;

/**
 * The rows one call (by its X-Request-Id) left: none for a route that is not audited or a caller
 * without a session; else exactly one, with the outcome and status of the answer, the caller,
 * the route, the patient when allowed, and for an allowed write the write's own transaction.
 */
export async function expectAuditRows(
  ctx: TestContext,
  route: string,
  res: { status: number; headers: Record<string, string> },
  who: string | null,
  xidBefore: bigint,
): Promise<void> {
  const expected = AUDIT_EXPECTATIONS[route];
  const requestId = res.headers['x-request-id'];
  expect(requestId, 'every reply carries its request id').toBeTruthy();
  const { rows } = await ctx.db.execute<Row>(sql`
    select a.action, a.outcome, a.http_status, a.route, u.email, a.record_type, a.record_id, a.patient_id,
           a.xmin::text as xmin
    from audit_events a left join users u on u.id = a.user_id
    where a.request_id = ${requestId}`);
  checked += 1;
  const named = who !== null || (expected?.action === 'sign-in' && rows.length > 0);
  if (!expected || !named || res.status === 401) {
    expect(rows, `${route} as ${who ?? 'no one'} (${res.status}) writes no audit row`).toEqual([]);
    return;
  }
  expect(rows, `${route} (${res.status}) writes exactly one audit row`).toHaveLength(1);
  const [row] = rows;
  const allowed = res.status < 400;
  expect(row).toMatchObject({
    action: !allowed && expected.action === 'sign-in' ? 'sign-in-failed' : expected.action,
    outcome: allowed ? 'allowed' : res.status >= 500 ? 'failed' : 'refused',
    http_status: res.status,
    route: route.replace(/^(\w+) \/api/, '$1 '),
    email: who,
  });
  if (!allowed) return;
  if (expected.patient) expect(row.patient_id, `${route} names the patient`).toBeTruthy();
  if (route.startsWith('GET ')) return;
  // A write: its row was written in the write's own transaction.
  if (row.record_type && NOT_A_ROW.has(row.record_type)) return;
  const table = row.record_type ? RECORD_TABLES[row.record_type] : undefined;
  expect(table, `${route} names a record of a known table (${row.record_type})`).toBeTruthy();
  expect(row.record_id, `${route} names the record it wrote`).toBeTruthy();
  const { rows: record } = await ctx.db.execute<{ xmin: string }>(
    sql`select xmin::text as xmin from ${sql.identifier(table!)} where id = ${row.record_id}`,
  );
  expect(record, `${route}: the record named exists`).toHaveLength(1);
  // A record row this request wrote (a transaction id from after the call began) was written in
  // the audit row's transaction. An older row was not written (e.g. the latest lab prescription
  // handed out again): such a call changed nothing for its row to share a transaction with.
  if (BigInt(record[0].xmin) >= xidBefore % 2n ** 32n) {
    expect(record[0].xmin, `${route}: the audit row commits with the write`).toBe(row.xmin);
  }
}

/** The next transaction id PostgreSQL will hand out (read before a call; assigns none itself). */
export async function nextXid(ctx: TestContext): Promise<bigint> {
  const { rows } = await ctx.db.execute<{ xid: string }>(
    sql`select pg_snapshot_xmax(pg_current_snapshot())::text as xid`,
  );
  return BigInt(rows[0].xid);
}
