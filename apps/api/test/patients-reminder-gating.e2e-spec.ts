// Recall reminders go only to patients who consented and are not archived: the scan logs none
// for the others, and a reminder logged before an archive (or a withdrawn consent) is withheld
// at send time instead of being mailed. Each test has its own patient and a recall date years
// apart from the others', so the scans of one test never reach another's (any order works).
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addCalendarDays } from '@torquetrail/domain';
import { recalls, reminderLog } from '../src/db/schema/index.js';
import { RemindersService } from '../src/recalls/reminders.service.js';
import { caughtFor } from './support/recalls.js';
import { signIn, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let admin: string;
let dentist: string;

beforeAll(async () => {
  ctx = await startTestApp();
  admin = await signIn(ctx, 'practice_admin');
  dentist = await signIn(ctx, 'dentist');
});
afterAll(() => ctx.close());

const CONSENT = { email: 'reminded@mail.example', emailReminderConsent: true, emailReminderConsentOn: '2026-01-10' };

/** A new patient (with consent unless told) and one scheduled recall on `dueOn`. */
async function patientDueOn(dueOn: string, over: object = CONSENT) {
  const res = await ctx.http
    .post('/api/patients')
    .set('Cookie', dentist)
    .send({ givenName: 'Rowena', familyName: 'Tregarthen', birthDate: '1959-09-09', ...over });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const { id, practiceId } = res.body as { id: string; practiceId: string };
  await ctx.db.insert(recalls).values({ practiceId, patientId: id, dueOn });
  return { id, practiceId };
}
const logged = (patientId: string) => ctx.db.select().from(reminderLog).where(eq(reminderLog.patientId, patientId));
/** The scan of the day ten days before `dueOn`: the upcoming reminder's window (policy 14 days). */
const scanBefore = async (dueOn: string) => {
  const res = await ctx.http
    .post('/api/recalls/reminders/run')
    .set('Cookie', admin)
    .send({ today: addCalendarDays(dueOn, -10) });
  expect(res.status).toBe(200);
};
const patch = (id: string, body: object) => ctx.http.patch(`/api/patients/${id}`).set('Cookie', dentist).send(body);
const archive = (id: string, action: 'archive' | 'unarchive') =>
  ctx.http.post(`/api/patients/${id}/${action}`).set('Cookie', dentist).send({ reason: 'Moved away' });

describe('reminders and consent', () => {
  it('logs no reminder for a patient without consent, and does once consent is recorded', async () => {
    const dueOn = '2031-03-10';
    const p = await patientDueOn(dueOn, { email: 'not-yet@mail.example' });
    await scanBefore(dueOn);
    expect(await logged(p.id)).toEqual([]);
    expect((await patch(p.id, { emailReminderConsent: true, emailReminderConsentOn: '2026-02-02' })).status).toBe(200);
    await scanBefore(dueOn);
    expect((await logged(p.id)).map((r) => [r.kind, r.recallDueOn])).toEqual([['upcoming', dueOn]]);
  });

  it('withholds a logged reminder when consent was withdrawn after it was logged', async () => {
    const p = await patientDueOn('2033-05-05');
    const [row] = await ctx.db
      .insert(reminderLog)
      .values({ ...p, patientId: p.id, recallDueOn: '2033-05-05', kind: 'upcoming', idempotencyKey: `gating:${p.id}` })
      .returning({ id: reminderLog.id });
    expect((await patch(p.id, { emailReminderConsent: false, emailReminderConsentOn: null })).status).toBe(200);
    expect(await ctx.app.get(RemindersService).deliver(row.id)).toBe('withheld');
    const [after] = await ctx.db.select().from(reminderLog).where(eq(reminderLog.id, row.id));
    expect(after).toMatchObject({ status: 'withheld', lastError: 'no consent to e-mail reminders', messageId: null });
  });
});

describe('reminders and archiving', () => {
  it('logs no reminder for an archived patient, and does again once they are brought back', async () => {
    const dueOn = '2035-07-07';
    const p = await patientDueOn(dueOn);
    expect((await archive(p.id, 'archive')).status).toBe(200);
    await scanBefore(dueOn);
    expect(await logged(p.id)).toEqual([]);
    expect((await archive(p.id, 'unarchive')).status).toBe(200);
    await scanBefore(dueOn);
    expect((await logged(p.id)).map((r) => r.kind)).toEqual(['upcoming']);
  });

  it('withholds at send time a reminder logged before the patient was archived: no mail goes out', async () => {
    const p = await patientDueOn('2037-09-09');
    // Logged by an earlier scan, not sent yet (inserted here so that no queued job races the archive).
    const [row] = await ctx.db
      .insert(reminderLog)
      .values({ ...p, patientId: p.id, recallDueOn: '2037-09-09', kind: 'upcoming', idempotencyKey: `gating:${p.id}` })
      .returning({ id: reminderLog.id });
    expect((await archive(p.id, 'archive')).status).toBe(200);
    expect(await ctx.app.get(RemindersService).deliver(row.id)).toBe('withheld');
    const [after] = await ctx.db.select().from(reminderLog).where(eq(reminderLog.id, row.id));
    expect(after).toMatchObject({ status: 'withheld', lastError: 'the patient is archived', messageId: null });
    expect(await caughtFor(row.id)).toEqual([]);
  });
});
