// Reminder e-mails through the pg-boss queue to the real SMTP catcher: the message arrives with
// the right recall date, once; a second scan or a retry of a sent key sends nothing.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { recalls, reminderLog } from '../src/db/schema/index.js';
import { addCalendarDays as addDaysIso } from '@torquetrail/domain';
import { RemindersService } from '../src/recalls/reminders.service.js';
import { patientId, signIn, startTestApp, type TestContext } from './support/test-app.js';
import { caughtFor, until } from './support/recalls.js';

process.env.REMINDER_RETRY_DELAY_S = '1';
let ctx: TestContext;
let admin: string;
let harold: string;
let dueOn: string;

beforeAll(async () => {
  ctx = await startTestApp();
  admin = await signIn(ctx, 'practice_admin');
  harold = await patientId(ctx.db, 'LL-1001');
  [{ dueOn }] = (await ctx.db.select({ dueOn: recalls.dueOn }).from(recalls).where(eq(recalls.patientId, harold))) as [
    { dueOn: string },
  ];
});
afterAll(() => ctx.close());

const haroldUpcoming = async () =>
  (await ctx.db.select().from(reminderLog).where(eq(reminderLog.patientId, harold))).filter(
    (r) => r.recallDueOn === dueOn && r.kind === 'upcoming',
  );

describe('the daily reminder scan', () => {
  // One story on Harold's upcoming reminder: each step needs the one before (nothing sent yet,
  // then sent once), so they run in this order inside one test.
  it(
    'sends nothing before the window (policy: 14 days before), then the upcoming reminder through SMTP once with the recall date, logged as sent; a second scan or a retry of the sent key sends nothing',
    { timeout: 90_000 },
    async () => {
      const early = await ctx.http
        .post('/api/recalls/reminders/run')
        .set('Cookie', admin)
        .send({ today: addDaysIso(dueOn, -15) });
      expect(early.status).toBe(200);
      expect(await haroldUpcoming()).toEqual([]);

      const res = await ctx.http
        .post('/api/recalls/reminders/run')
        .set('Cookie', admin)
        .send({ today: addDaysIso(dueOn, -10) });
      expect(res.status).toBe(200);
      expect(res.body.logged).toBeGreaterThanOrEqual(1);
      const row = await until(async () => (await haroldUpcoming()).find((r) => r.status === 'sent'), 30_000);
      expect(row).toMatchObject({ status: 'sent', attempts: 1, lastError: null });
      const messages = await until(
        async () => ((await caughtFor(row.id)).length > 0 ? caughtFor(row.id) : undefined),
        10_000,
      );
      expect(messages).toHaveLength(1);
      const [mail] = messages;
      expect(mail.envelopeTo).toEqual(['harold.whitcombe@mail.example']);
      const long = new Date(`${dueOn}T00:00:00Z`).toLocaleDateString('en-GB', {
        day: 'numeric',
        month: 'long',
        year: 'numeric',
        timeZone: 'UTC',
      });
      expect(mail.subject).toBe(`Your implant maintenance visit is due on ${long}`);
      // In the practice's words only: the stored YYYY-MM-DD is not printed beside it (issue 15 §7).
      expect(mail.text).toContain(long);
      expect(mail.text).not.toContain(dueOn);
      expect(mail.headers['x-torquetrail-reminder-key']).toBe(`recall-reminder:${harold}:${dueOn}:upcoming`);
      const log = await ctx.http.get('/api/recalls/reminders').set('Cookie', admin);
      expect(
        log.body.items.some(
          (i: { chartNumber: string; recallDueOn: string }) => i.chartNumber === 'LL-1001' && i.recallDueOn === dueOn,
        ),
      ).toBe(true);

      const again = await ctx.http
        .post('/api/recalls/reminders/run')
        .set('Cookie', admin)
        .send({ today: addDaysIso(dueOn, -9) });
      expect(again.body).toMatchObject({ logged: 0 });
      expect(await ctx.app.get(RemindersService).deliver(row.id)).toBe('already-sent');
      await new Promise((r) => setTimeout(r, 2500));
      expect(await caughtFor(row.id)).toHaveLength(1);
      expect(await haroldUpcoming()).toHaveLength(1);
    },
  );

  it('does not repeat the overdue reminder already sent to Imogen (seeded), and the admin sees the log', async () => {
    const imogen = await patientId(ctx.db, 'LL-1002');
    const before = await ctx.db.select().from(reminderLog).where(eq(reminderLog.patientId, imogen));
    const res = await ctx.http.post('/api/recalls/reminders/run').set('Cookie', admin).send({});
    expect(res.status).toBe(200);
    expect(await ctx.db.select().from(reminderLog).where(eq(reminderLog.patientId, imogen))).toEqual(before);
    const log = await ctx.http.get('/api/recalls/reminders').set('Cookie', admin);
    expect(log.status).toBe(200);
    expect(
      log.body.items.filter(
        (i: { chartNumber: string; kind: string; status: string }) =>
          i.chartNumber === 'LL-1002' && i.kind === 'overdue' && i.status === 'sent',
      ),
    ).toHaveLength(1);
  });
});
