// The referral summary: what the PDF shows of a patient's implants, the shares it can be sent
// through, and its mail requests (the job queue sends them). Scoped by the caller's checks.
import { and, desc, eq, sql } from 'drizzle-orm';
import type { PeriImplantStatus, ComponentKind, SiteStatus } from '@torquetrail/contracts';
import { visiblePatients } from '../authz/visible-patients.js';
import type { Scope } from '../authz/scope.js';
import type { Db, Tx } from '../db/database.js';
import { liveShare } from '../db/live-share.js';
import { partInPlaceSql } from '../db/parts-in-place.js';
import { patientShares, patients, practices, referralSummaryMails, users } from '../db/schema/index.js';

export async function findVisiblePatient(db: Db, scope: Scope, id: string) {
  const [row] = await db
    .select({
      id: patients.id,
      practiceId: patients.practiceId,
      chartNumber: patients.chartNumber,
      givenName: patients.givenName,
      familyName: patients.familyName,
      birthDate: patients.birthDate,
    })
    .from(patients)
    .where(and(eq(patients.id, id), visiblePatients(scope)));
  return row ? { ...row, patientId: row.id } : null;
}

/** The patient's shares still in force, with the surgeon the summary goes to. */
export async function activeShares(db: Db, patientId: string) {
  return db
    .select({
      shareId: patientShares.id,
      surgeonName: users.displayName,
      surgeonEmail: users.email,
      practiceName: practices.name,
    })
    .from(patientShares)
    .innerJoin(users, eq(users.id, patientShares.sharedWithUserId))
    .innerJoin(practices, eq(practices.id, users.practiceId))
    .where(and(eq(patientShares.patientId, patientId), liveShare(), sql`'outcomes' = any(${patientShares.scopes})`))
    .orderBy(users.displayName);
}

/** The chosen sites a share opens: null when it opens every site of the patient. */
export async function shareSiteIds(db: Db, shareId: string): Promise<string[] | null> {
  const [row] = await db
    .select({ siteIds: patientShares.siteIds })
    .from(patientShares)
    .where(eq(patientShares.id, shareId));
  return row?.siteIds ?? null;
}

export async function practiceName(db: Db, practiceId: string): Promise<string> {
  const [row] = await db.select({ name: practices.name }).from(practices).where(eq(practices.id, practiceId));
  return row?.name ?? '';
}

export interface SummarySite {
  siteId: string;
  fdi: number;
  status: SiteStatus;
  endedOn: string | null;
  placedOn: string;
  system: string;
  manufacturer: string;
  platform: string;
  diameterMm: number;
  lengthMm: number;
  lot: string | null;
  surgeonName: string;
  insertionTorqueNcm: number | null;
  stabilityIsq: number | null;
  loadingProtocol: string | null;
  kind: string | null;
  retention: string | null;
  material: string | null;
  deliveredOn: string | null;
  examStatus: PeriImplantStatus | null;
  examinedOn: string | null;
}

/** Each implant site of the patient with a current placement: placement, delivered restoration, last exam. */
export async function summarySites(db: Db, patientId: string): Promise<SummarySite[]> {
  const result = await db.execute(sql`
    select s.id as "siteId", s.fdi, s.status, s.ended_on::text as "endedOn", pl.placed_on::text as "placedOn",
           sy.name as system, sy.manufacturer, pf.name as platform, pf.diameter_mm as "diameterMm",
           pl.length_mm as "lengthMm", pl.lot, pl.surgeon_name as "surgeonName",
           pl.insertion_torque_ncm as "insertionTorqueNcm", pl.stability_isq as "stabilityIsq",
           pl.loading_protocol as "loadingProtocol", rr.kind, rr.retention, rr.material,
           rr.delivered_on::text as "deliveredOn", ex.status as "examStatus", ex.examined_on::text as "examinedOn"
      from implant_sites s
      join placements pl on pl.site_id = s.id
           and not exists (select 1 from placements n where n.supersedes_id = pl.id)
      join platforms pf on pf.id = pl.platform_id
      join implant_systems sy on sy.id = pf.system_id
      left join lateral (
        select r.kind, r.retention, r.material, r.delivered_on from restoration_sites rs
          join restorations r on r.id = rs.restoration_id
         where rs.site_id = s.id and r.delivered_on is not null and r.status <> 'removed'
           and not exists (select 1 from restorations n where n.supersedes_id = r.id)
         order by r.delivered_on desc limit 1
      ) rr on true
      left join lateral (
        select e.status, e.examined_on from recall_exams e
         where e.site_id = s.id and not exists (select 1 from recall_exams n where n.supersedes_id = e.id)
         order by e.examined_on desc, e.recorded_at desc limit 1
      ) ex on true
     where s.patient_id = ${patientId}
     order by s.fdi`);
  return result.rows.map((r) => ({
    ...(r as unknown as SummarySite),
    diameterMm: Number(r.diameterMm),
    lengthMm: Number(r.lengthMm),
    insertionTorqueNcm: r.insertionTorqueNcm === null ? null : Number(r.insertionTorqueNcm),
  }));
}

/** The parts in place at the sites (not removed). */
export async function partsInPlace(db: Db, siteIds: readonly string[]) {
  if (siteIds.length === 0) return [];
  const result = await db.execute<{
    siteId: string;
    kind: ComponentKind;
    name: string;
    referenceCode: string;
    lot: string | null;
    installedOn: string;
  }>(sql`
    select ci.site_id as "siteId", co.kind, co.name, co.reference_code as "referenceCode", ci.lot,
           ci.installed_on::text as "installedOn"
      from component_instances ci join components co on co.id = ci.component_id
     where ci.site_id in (${sql.join(
       siteIds.map((id) => sql`${id}::uuid`),
       sql`, `,
     )}) and ${partInPlaceSql('ci')}
     order by ci.installed_on`);
  return result.rows;
}

const mailColumns = {
  id: referralSummaryMails.id,
  shareId: referralSummaryMails.shareId,
  sentTo: referralSummaryMails.sentTo,
  status: referralSummaryMails.status,
  attempts: referralSummaryMails.attempts,
  requestedAt: referralSummaryMails.requestedAt,
  sentAt: referralSummaryMails.sentAt,
};

export async function mailsOfPatient(db: Db, patientId: string) {
  return db
    .select(mailColumns)
    .from(referralSummaryMails)
    .where(eq(referralSummaryMails.patientId, patientId))
    .orderBy(desc(referralSummaryMails.requestedAt))
    .limit(50);
}

/**
 * Records a request, or finds the one it repeats: the same idempotency key, or a request for the
 * share still waiting. Returns the row and whether this call made it.
 */
export async function requestMail(
  tx: Tx,
  v: {
    practiceId: string;
    patientId: string;
    shareId: string;
    sentTo: string;
    idempotencyKey: string;
    requestedBy: string;
  },
) {
  const [made] = await tx.insert(referralSummaryMails).values(v).onConflictDoNothing().returning(mailColumns);
  if (made) return { mail: made, created: true };
  const [same] = await tx
    .select(mailColumns)
    .from(referralSummaryMails)
    .where(
      sql`${referralSummaryMails.practiceId} = ${v.practiceId} and (${referralSummaryMails.idempotencyKey} = ${v.idempotencyKey}
          or (${referralSummaryMails.shareId} = ${v.shareId} and ${referralSummaryMails.status} = 'pending'))`,
    )
    .orderBy(desc(referralSummaryMails.requestedAt))
    .limit(1);
  return { mail: same, created: false };
}

export async function listPendingMails(db: Db) {
  return db
    .select({ id: referralSummaryMails.id })
    .from(referralSummaryMails)
    .where(eq(referralSummaryMails.status, 'pending'));
}

export async function lockMail(tx: Tx, id: string) {
  const [row] = await tx
    .select({
      id: referralSummaryMails.id,
      status: referralSummaryMails.status,
      sentTo: referralSummaryMails.sentTo,
      shareId: referralSummaryMails.shareId,
      patientId: referralSummaryMails.patientId,
      practiceId: referralSummaryMails.practiceId,
    })
    .from(referralSummaryMails)
    .where(eq(referralSummaryMails.id, id))
    .for('update');
  return row ?? null;
}

export async function markMailSent(tx: Tx, id: string, messageId: string) {
  await tx
    .update(referralSummaryMails)
    .set({
      status: 'sent',
      messageId,
      sentAt: new Date(),
      attempts: sql`${referralSummaryMails.attempts} + 1`,
      lastError: null,
    })
    .where(eq(referralSummaryMails.id, id));
}

export async function markMailAttemptFailed(tx: Tx, id: string, error: string, final: boolean) {
  await tx
    .update(referralSummaryMails)
    .set({
      attempts: sql`${referralSummaryMails.attempts} + 1`,
      lastError: error.slice(0, 500),
      ...(final ? { status: 'failed' as const } : {}),
    })
    .where(eq(referralSummaryMails.id, id));
}
