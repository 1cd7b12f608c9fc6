// The S3 fake and the SMTP catcher stopped and started again. S3 away: a lab prescription and a
// download answer 503 with a plain message and leave no row behind; both work once S3 is back.
// SMTP away: a lab prescription e-mail and a recall reminder wait in the job queue (each failed
// attempt recorded) and are delivered exactly once after the catcher returns.
import { eq } from 'drizzle-orm';
import { addCalendarDays } from '@torquetrail/domain';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { labPrescriptionMails, labPrescriptions, recalls, reminderLog } from '../../src/db/schema/index.js';
import { RemindersService } from '../../src/recalls/reminders.service.js';
import { larkspurId, parts } from '../support/ledger-fixtures.js';
import { caughtFor, until } from '../support/recalls.js';
import { patientId, signIn, siteId, startTestApp, type TestContext } from '../support/test-app.js';
import { report, services } from './fault-harness.js';

// Retries after 1, 2, 4 … s, so a mail waits seconds, not minutes, for the catcher.
process.env.REMINDER_RETRY_DELAY_S = '1';

const CATCHER = `http://127.0.0.1:${process.env.TT_MAIL_HTTP_PORT ?? 2580}/messages`;
const STORAGE_AWAY = 'File storage is not reachable; try again in a moment';

let ctx: TestContext;
let svc: Awaited<ReturnType<typeof services>>;
let dentist: string;
let planId: string;

beforeAll(async () => {
  svc = await services();
  ctx = await startTestApp();
  dentist = await signIn(ctx, 'dentist');
  const part = await parts(ctx.db, await larkspurId(ctx.db), 'Tessely EX 4.1');
  const sites = [await siteId(ctx.db, 'LL-1005', 15), await siteId(ctx.db, 'LL-1005', 16)];
  const plan = await ctx.http
    .post('/api/restorations')
    .set('Cookie', dentist)
    .send({
      patientId: await patientId(ctx.db, 'LL-1005'),
      kind: 'splinted-bridge',
      retention: 'screw-to-implant',
      material: 'zirconia',
      copingsSplinted: true,
      labName: 'Ferncliff Dental Lab',
      labEmail: `faults+${Date.now()}@ferncliff-lab.example`,
      sites: sites.map((s) => ({
        siteId: s,
        interface: 'non-engaging',
        impressionCoping: 'non-engaging',
        screwComponentIds: [part('PSI')],
        impressionCopingComponentId: part('ICN-O'),
      })),
    });
  if (plan.status !== 201) throw new Error(`the plan was not saved: ${JSON.stringify(plan.body)}`);
  planId = plan.body.id;
});
afterAll(async () => {
  await svc.startService('s3');
  await svc.startService('mail');
  await ctx.close();
});

const prescriptionRows = async () =>
  (await ctx.db.select().from(labPrescriptions).where(eq(labPrescriptions.restorationId, planId))).length;

describe('S3 away', () => {
  it('lab prescription and download answer 503 with no orphan row; both work once S3 is back', async () => {
    const path = `/api/restorations/${planId}/lab-prescriptions`;
    const first = await ctx.http.post(path).set('Cookie', dentist).send({ revise: true });
    expect(first.status).toBe(201);
    const before = await prescriptionRows();
    const away: { status: number; message: string }[] = [];
    try {
      await svc.stopService('s3');
      for (let i = 0; i < 3; i++) {
        const res = await ctx.http.post(path).set('Cookie', dentist).send({ revise: true });
        away.push({ status: res.status, message: res.body.message });
      }
      const pdf = await ctx.http.get(`/api/lab-prescriptions/${first.body.id}/pdf`).set('Cookie', dentist);
      away.push({ status: pdf.status, message: pdf.body.message });
    } finally {
      await svc.startService('s3');
    }
    expect(away).toEqual(Array.from({ length: 4 }, () => ({ status: 503, message: STORAGE_AWAY })));
    const afterAway = await prescriptionRows();
    const again = await ctx.http.post(path).set('Cookie', dentist).send({ revise: true });
    expect(again.status).toBe(201);
    const pdf = await ctx.http.get(`/api/lab-prescriptions/${again.body.id}/pdf`).set('Cookie', dentist);
    expect(pdf.status).toBe(200);
    expect(afterAway).toBe(before);
    report('S3 fake stopped during lab prescriptions', {
      'faults injected': 1,
      'requests while away': away.length,
      'answered 503': away.filter((a) => a.status === 503).length,
      'rows written while away': afterAway - before,
      'after restart': `${again.status} (write), ${pdf.status} (download)`,
    });
  });
});

describe('SMTP away', () => {
  it(
    'a lab mail and a reminder wait in the queue and are delivered exactly once when SMTP returns',
    { timeout: 60_000 },
    async () => {
      const harold = await patientId(ctx.db, 'LL-1001');
      const [{ dueOn }] = await ctx.db
        .select({ dueOn: recalls.dueOn })
        .from(recalls)
        .where(eq(recalls.patientId, harold));
      const reminder = async () =>
        (await ctx.db.select().from(reminderLog).where(eq(reminderLog.patientId, harold))).find(
          (r) => r.recallDueOn === dueOn && r.kind === 'upcoming',
        );
      const labMail = async (prescriptionId: string) =>
        (
          await ctx.db
            .select()
            .from(labPrescriptionMails)
            .where(eq(labPrescriptionMails.labPrescriptionId, prescriptionId))
        )[0];
      const caughtLab = async (mailId: string) =>
        ((await (await fetch(CATCHER)).json()) as { headers: Record<string, string> }[]).filter(
          (m) => m.headers['x-torquetrail-lab-mail'] === mailId,
        );

      let made: { status: number; body: { id: string; lastEmail: { status: string } | null } };
      let failedAttempts: { lab: number; reminder: number };
      try {
        await svc.stopService('mail');
        made = await ctx.http
          .post(`/api/restorations/${planId}/lab-prescriptions`)
          .set('Cookie', dentist)
          .send({ emailToLab: true });
        await ctx.app.get(RemindersService).scan(addCalendarDays(dueOn, -10));
        // Each has failed at least twice (first try and a retry), recorded, nothing sent.
        const lab = await until(async () => {
          const row = await labMail(made.body.id);
          return row && row.attempts >= 2 ? row : null;
        }, 20_000);
        const rem = await until(async () => {
          const row = await reminder();
          return row && row.attempts >= 2 ? row : null;
        }, 20_000);
        failedAttempts = { lab: lab.attempts, reminder: rem.attempts };
        expect([lab.status, rem.status]).toEqual(['pending', 'pending']);
        expect(lab.lastError).toMatch(/ECONNREFUSED|connect/i);
      } finally {
        await svc.startService('mail');
      }
      expect(made.status).toBe(201);
      expect(made.body.lastEmail?.status).toBe('pending');
      const lab = await until(async () => {
        const row = await labMail(made.body.id);
        return row?.status === 'sent' ? row : null;
      }, 30_000);
      const rem = await until(async () => {
        const row = await reminder();
        return row?.status === 'sent' ? row : null;
      }, 30_000);
      // Give a stray duplicate the time to arrive before counting.
      await new Promise((r) => setTimeout(r, 2000));
      const delivered = { lab: (await caughtLab(lab.id)).length, reminder: (await caughtFor(rem.id)).length };
      expect(delivered).toEqual({ lab: 1, reminder: 1 });
      report('SMTP catcher stopped with a lab mail and a reminder queued', {
        'faults injected': 1,
        'mails expected': 2,
        'mails delivered': delivered.lab + delivered.reminder,
        'failed attempts recorded while away': `${failedAttempts.lab} (lab), ${failedAttempts.reminder} (reminder)`,
      });
    },
  );
});
