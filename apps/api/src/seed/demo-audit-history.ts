// A few months of audit trail (issue 11) on top of the demo's clinical history: every recall
// visit of the last four months leaves what the app would have written that day (the hygienist
// signs in, opens the patient and the exam form, saves the visit; the dentist reviews the sites),
// the wrench recalibration leaves a catalogue change, the administrator exports the Recall desk
// at the start of each month, the Northgate surgeon opens a shared patient, and one mistyped
// password is refused. Addresses and browsers are invented (documentation ranges, RFC 5737).
import { and, eq, gte, isNull } from 'drizzle-orm';
import type { AuditAction, AuditOutcome } from '@torquetrail/contracts';
import type { Role } from '@torquetrail/authz';
import type { Tx } from '../db/database.js';
import { auditEvents, recallExams, users, wrenchCalibrations } from '../db/schema/index.js';
import type { DemoRefs } from './demo-scenario.js';

const HISTORY_DAYS = 120;
const DESK = {
  address: '192.0.2.21',
  userAgent: 'Mozilla/5.0 (X11; Linux x86_64; rv:128.0) Gecko/20100101 Firefox/128.0',
};
const SURGERY = {
  address: '192.0.2.34',
  userAgent: 'Mozilla/5.0 (Windows NT 10.0; Win64; x64) Chrome/131.0 Safari/537.36',
};
const NORTHGATE = {
  address: '198.51.100.7',
  userAgent: 'Mozilla/5.0 (Macintosh; Intel Mac OS X 14_6) Safari/605.1.15',
};

interface Event {
  at: Date;
  user: { id: string; role: Role; practiceId: string };
  action: AuditAction;
  route: string;
  status?: number;
  outcome?: AuditOutcome;
  /** The practice whose record it is, when not the user's own (a share). */
  practiceId?: string;
  recordType?: string;
  recordId?: string;
  patientId?: string;
  query?: Record<string, unknown>;
  after?: unknown;
  from: { address: string; userAgent: string };
}

const dayAt = (day: string, hour: number, minute: number) =>
  new Date(`${day}T${String(hour).padStart(2, '0')}:${String(minute).padStart(2, '0')}:00Z`);

export async function seedAuditHistory(tx: Tx, refs: DemoRefs): Promise<void> {
  const since = new Date(`${refs.today}T00:00:00Z`);
  since.setUTCDate(since.getUTCDate() - HISTORY_DAYS);
  const sinceDay = since.toISOString().slice(0, 10);
  const people = new Map(
    (
      await tx.select({ id: users.id, email: users.email, role: users.role, practiceId: users.practiceId }).from(users)
    ).map((u) => [u.email, u]),
  );
  const person = (email: string) => {
    const found = people.get(email);
    if (!found) throw new Error(`seed: no user ${email}`);
    return found;
  };
  const dentist = person('ines.calloway@larkspur.example');
  const admin = person('odile.park@larkspur.example');
  const hygienist = person('maren.holt@larkspur.example');
  const surgeon = person('rafael.imbert@northgate.example');
  const events: Event[] = [];

  // Every recall visit of the period, as the hygienist and the dentist went through it.
  const exams = await tx
    .select({
      id: recallExams.id,
      visitId: recallExams.visitId,
      patientId: recallExams.patientId,
      siteId: recallExams.siteId,
      examinedOn: recallExams.examinedOn,
      examinerId: recallExams.examinerId,
    })
    .from(recallExams)
    .where(and(gte(recallExams.examinedOn, sinceDay), isNull(recallExams.supersedesId)));
  const visits = new Map<string, typeof exams>();
  for (const exam of exams) visits.set(exam.visitId, [...(visits.get(exam.visitId) ?? []), exam]);
  let slot = 0;
  for (const visit of visits.values()) {
    const [first] = visit;
    const examiner = [...people.values()].find((u) => u.id === first.examinerId) ?? hygienist;
    const hour = 9 + (slot++ % 6);
    const on = first.examinedOn;
    const patient = { patientId: first.patientId, recordType: 'Patient', recordId: first.patientId };
    events.push(
      {
        at: dayAt(on, hour, 2),
        user: examiner,
        action: 'sign-in',
        route: 'POST /auth/sign-in',
        recordType: 'User',
        from: SURGERY,
      },
      { at: dayAt(on, hour, 3), user: examiner, action: 'read', route: 'GET /patients/:id', ...patient, from: SURGERY },
      {
        at: dayAt(on, hour, 4),
        user: examiner,
        action: 'read',
        route: 'GET /recalls/patients/:id/exam-context',
        ...patient,
        from: SURGERY,
      },
      {
        at: dayAt(on, hour, 31),
        user: examiner,
        action: 'create',
        route: 'POST /recalls/visits',
        status: 201,
        recordType: 'RecallExam',
        recordId: first.id,
        patientId: first.patientId,
        after: { examinedOn: on, sites: visit.length },
        from: SURGERY,
      },
      {
        at: dayAt(on, hour, 33),
        user: examiner,
        action: 'sign-out',
        route: 'POST /auth/sign-out',
        status: 204,
        from: SURGERY,
      },
      ...visit.map((exam, i) => ({
        at: dayAt(on, 17, 10 + i),
        user: dentist,
        action: 'read' as const,
        route: 'GET /sites/:id',
        recordType: 'ImplantSite',
        recordId: exam.siteId,
        patientId: exam.patientId,
        from: SURGERY,
      })),
    );
  }

  // The wrench recalibrations of the period (ledger history).
  const calibrations = await tx
    .select({ id: wrenchCalibrations.id, on: wrenchCalibrations.calibratedOn })
    .from(wrenchCalibrations)
    .where(
      and(eq(wrenchCalibrations.practiceId, refs.practiceIds.larkspur), gte(wrenchCalibrations.calibratedOn, sinceDay)),
    );
  for (const c of calibrations) {
    events.push({
      at: dayAt(c.on, 12, 40),
      user: admin,
      action: 'catalogue-change',
      route: 'POST /wrenches/:id/calibrations',
      status: 201,
      recordType: 'WrenchCalibration',
      recordId: c.id,
      after: { calibratedOn: c.on, note: 'Recalibrated after a reading drifted' },
      from: DESK,
    });
  }

  // The administrator's monthly round: the Recall desk as CSV and the reminder log.
  for (let month = 0; month < 4; month += 1) {
    const day = new Date(`${refs.today}T00:00:00Z`);
    day.setUTCMonth(day.getUTCMonth() - month, 1);
    const on = day.toISOString().slice(0, 10);
    if (on < sinceDay || on >= refs.today) continue;
    events.push(
      {
        at: dayAt(on, 8, 15),
        user: admin,
        action: 'sign-in',
        route: 'POST /auth/sign-in',
        recordType: 'User',
        from: DESK,
      },
      {
        at: dayAt(on, 8, 17),
        user: admin,
        action: 'export',
        route: 'GET /recalls/desk/csv',
        query: { filter: 'overdue' },
        recordType: 'RecallExam',
        from: DESK,
      },
      {
        at: dayAt(on, 8, 20),
        user: admin,
        action: 'read',
        route: 'GET /recalls/reminders',
        recordType: 'AuditEntry',
        from: DESK,
      },
    );
  }

  // The referring surgeon follows Harold Whitcombe's implants through the share; a mistyped password.
  const harold = refs.patientIds.get('LL-1001')!;
  const sharedDay = new Date(`${refs.today}T00:00:00Z`);
  sharedDay.setUTCDate(sharedDay.getUTCDate() - 12);
  const shared = sharedDay.toISOString().slice(0, 10);
  events.push(
    {
      at: dayAt(shared, 19, 5),
      user: surgeon,
      action: 'read',
      route: 'GET /sites/:id',
      practiceId: refs.practiceIds.larkspur,
      recordType: 'ImplantSite',
      recordId: refs.siteIds.get('LL-1001:35'),
      patientId: harold,
      from: NORTHGATE,
    },
    {
      at: dayAt(shared, 7, 58),
      user: hygienist,
      action: 'sign-in-failed',
      outcome: 'refused',
      status: 401,
      route: 'POST /auth/sign-in',
      recordType: 'User',
      from: DESK,
    },
  );

  const rows = events
    .filter((e) => e.at.toISOString().slice(0, 10) < refs.today)
    .map((e) => ({
      at: e.at,
      practiceId: e.practiceId ?? e.user.practiceId,
      userId: e.user.id,
      role: e.user.role,
      action: e.action,
      outcome: e.outcome ?? 'allowed',
      httpStatus: e.status ?? 200,
      route: e.route,
      recordType: e.recordType ?? null,
      recordId: e.recordId ?? null,
      patientId: e.patientId ?? null,
      query: e.query ?? null,
      after: e.after ?? null,
      address: e.from.address,
      userAgent: e.from.userAgent,
    }));
  if (rows.length > 0) await tx.insert(auditEvents).values(rows);
}
