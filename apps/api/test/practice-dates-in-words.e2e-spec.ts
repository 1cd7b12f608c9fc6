// Dates a person reads, in the practice's format (issue 15 §7): with Larkspur set to
// month-day-year, every e-mail body the API composes (lab prescription, share notice, invitation,
// password reset) and every message that quotes a date (a refused torque, the Timeline's words)
// writes it month first, and none prints the stored YYYY-MM-DD. The `fields` keys stay machine
// paths. Orders: month/day/year in the US [common practice]; Intl en-US writes "Dec 18, 2026".
import { writeCalendarDate } from '@torquetrail/contracts';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { larkspurId, parts, patientWithPart } from './support/ledger-fixtures.js';
import { freshEmail, linkMailedTo, mailsTo, throwawayAccount } from './support/people.js';
import { until } from './support/recalls.js';
import { patientId, signInAll, siteId, startTestApp, type TestContext } from './support/test-app.js';

/** A calendar date as stored: what no reader of a month-day-year practice should see. */
const ISO_DATE = /\b\d{4}-\d{2}-\d{2}\b/;
const monthFirst = (iso: string) => writeCalendarDate(iso, 'month-day-year');
/** An instant as Intl en-US writes it with the time (the narrow space before AM/PM is a \s). */
const MONTH_FIRST_INSTANT_UTC = /[A-Z][a-z]{2} \d{1,2}, \d{4}, \d{2}:\d{2}\s(AM|PM) UTC/;

let ctx: TestContext;
let cookies: Awaited<ReturnType<typeof signInAll>>;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await signInAll(ctx);
  const res = await ctx.http
    .put('/api/practice/session-settings')
    .set('Cookie', cookies.practice_admin)
    .send({ idleSignOutMinutes: 15, dateFormat: 'month-day-year' });
  if (res.status !== 200) throw new Error(`the date format was not set: ${JSON.stringify(res.body)}`);
});
afterAll(() => ctx.close());

const inDays = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

describe('e-mail bodies of a month-day-year practice', () => {
  it('the lab prescription mail gives the due date month first', { timeout: 60_000 }, async () => {
    const part = await parts(ctx.db, await larkspurId(ctx.db), 'Tessely EX 4.1');
    const labEmail = freshEmail('orders', 'ferncliff-lab.example');
    const plan = await ctx.http
      .post('/api/restorations')
      .set('Cookie', cookies.dentist)
      .send({
        patientId: await patientId(ctx.db, 'LL-1005'),
        kind: 'splinted-bridge',
        retention: 'screw-to-implant',
        material: 'zirconia',
        copingsSplinted: true,
        labName: 'Ferncliff Dental Lab',
        labEmail,
        dueOn: '2026-12-18',
        sites: await Promise.all(
          [15, 16].map(async (fdi) => ({
            siteId: await siteId(ctx.db, 'LL-1005', fdi),
            interface: 'non-engaging',
            impressionCoping: 'non-engaging',
            screwComponentIds: [part('PSI')],
            impressionCopingComponentId: part('ICN-O'),
          })),
        ),
      });
    expect(plan.status, JSON.stringify(plan.body)).toBe(201);
    const made = await ctx.http
      .post(`/api/restorations/${plan.body.id}/lab-prescriptions`)
      .set('Cookie', cookies.dentist)
      .send({ emailToLab: true });
    expect(made.status).toBe(201);
    const mail = await until(async () => (await mailsTo(labEmail))[0], 30_000);
    expect(mail.text).toContain(`Due ${monthFirst('2026-12-18')}.`);
    expect(mail.text).toContain('Due Dec 18, 2026.');
    expect(mail.text).not.toMatch(ISO_DATE);
  });

  it('the share notice gives the last day of the share month first', { timeout: 60_000 }, async () => {
    const surgeon = await throwawayAccount(ctx, 'surgeon');
    const patient = await ctx.http
      .post('/api/patients')
      .set('Cookie', cookies.dentist)
      .send({ givenName: 'Odalys', familyName: 'Datewright', birthDate: '1968-05-21' });
    expect(patient.status).toBe(201);
    const endsOn = inDays(200);
    const share = await ctx.http
      .post(`/api/patients/${patient.body.id}/shares`)
      .set('Cookie', cookies.dentist)
      .send({ surgeonEmail: surgeon.email, scopes: ['outcomes'], siteIds: null, endsOn, reason: 'Referred' });
    expect(share.status, JSON.stringify(share.body)).toBe(201);
    const mail = await until(async () => (await mailsTo(surgeon.email))[0], 30_000);
    expect(mail.text).toContain(`until ${monthFirst(endsOn)} inclusive`);
    expect(mail.text).not.toMatch(ISO_DATE);
  });

  it(
    'the invitation and the password reset say until when the link works, month first',
    { timeout: 90_000 },
    async () => {
      const invitee = freshEmail('dates.invitee');
      const invited = await ctx.http
        .post('/api/people/invitations')
        .set('Cookie', cookies.practice_admin)
        .send({ email: invitee, role: 'hygienist' });
      expect(invited.status).toBe(201);
      const invitation = (await linkMailedTo(invitee)).mail;

      const colleague = await throwawayAccount(ctx, 'hygienist');
      expect((await ctx.http.post('/api/account/password-reset').send({ email: colleague.email })).status).toBe(200);
      const reset = (await linkMailedTo(colleague.email)).mail;

      for (const mail of [invitation, reset]) {
        expect(mail.text).toMatch(new RegExp(`until ${MONTH_FIRST_INSTANT_UTC.source}`));
        expect(mail.text).not.toMatch(ISO_DATE);
      }
    },
  );
});

describe('messages that quote a date, for a month-day-year practice', () => {
  it('a torque on a removed screw is refused naming the day month first; the Timeline writes its days so too', async () => {
    const { siteId: site, instanceId: screw } = await patientWithPart(ctx, 'T-DATES1', 'Solvra CN 4.3', 'PSI');
    const log = (body: object) => ctx.http.post('/api/torque-events').set('Cookie', cookies.dentist).send(body);
    // A history on the screw first: its series (and caption) stays in the Timeline once removed.
    const before = await log({
      componentInstanceId: screw,
      appliedNcm: 25,
      reason: 're-torque-at-recall',
      performedAt: '2026-11-02T10:00:00Z',
    });
    expect(before.status).toBe(201);
    const replaced = await log({
      componentInstanceId: screw,
      appliedNcm: 25,
      reason: 'screw-replaced',
      replacementLot: 'PSI-DATES-1',
    });
    expect(replaced.status).toBe(201);
    const removed = (
      await ctx.http.get(`/api/sites/${site}/timeline?kinds=part`).set('Cookie', cookies.dentist)
    ).body.events.find((e: { title: string }) => e.title.startsWith('Removed'));
    const removedOn = (removed as { at: string }).at.slice(0, 10);

    const refused = await log({ componentInstanceId: screw, appliedNcm: 25, reason: 're-torque-at-recall' });
    expect(refused.status).toBe(409);
    expect(refused.body.message).toBe(
      `This part was removed on ${monthFirst(removedOn)}; log the torque on the part in place`,
    );
    expect(refused.body.message).not.toMatch(ISO_DATE);

    const timeline = (await ctx.http.get(`/api/sites/${site}/timeline`).set('Cookie', cookies.dentist)).body;
    const old = timeline.torqueSeries.find((s: { componentInstanceId: string }) => s.componentInstanceId === screw);
    // installedOn of the fixture's part: 2026-10-15.
    expect(old.label).toContain(`(installed Oct 15, 2026, removed ${monthFirst(removedOn)})`);
    const words = [
      ...timeline.torqueSeries.map((s: { label: string }) => s.label),
      ...timeline.events.flatMap((e: { title: string; detail: string | null }) => [e.title, e.detail ?? '']),
    ];
    expect(words.filter((w) => ISO_DATE.test(w))).toEqual([]);
  });

  it('the API still takes and returns machine dates: the refused field is named by its path', async () => {
    const res = await ctx.http
      .post('/api/patients')
      .set('Cookie', cookies.dentist)
      .send({ givenName: 'Odalys', familyName: 'Datewright', birthDate: '05/21/1968' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.fields)).toEqual(['birthDate']);
  });
});
