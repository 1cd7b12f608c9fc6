// The practice's date format (issue 15 §7): set by its administrator with the sign-in settings
// (validated beside the field, audited with before and after), sent with every user's session,
// and used by the documents the practice prints. Sources for the orders: ISO 8601-1:2019 §5.2.2
// (year-month-day); day/month/year in the UK, month/day/year in the US [common practice].
import { and, desc, eq } from 'drizzle-orm';
import { writeCalendarDate } from '@torquetrail/contracts';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents, patients } from '../src/db/schema/index.js';
import { all, describeRoleMatrix } from './support/role-matrix.js';
import { patientId, signIn, signInAll, startTestApp, type TestContext } from './support/test-app.js';
import { replyBytes } from './support/reply-bytes.js';
import { pdfText } from './support/pdf-text.js';

let ctx: TestContext;
let cookies: Awaited<ReturnType<typeof signInAll>>;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await signInAll(ctx);
});
afterAll(() => ctx.close());

const settings = (dateFormat: string) => ({ idleSignOutMinutes: 15, dateFormat });
const put = (body: object, cookie = cookies.practice_admin) =>
  ctx.http.put('/api/practice/session-settings').set('Cookie', cookie).send(body);

const pdf = (path: string, cookie: string) => ctx.http.get(path).set('Cookie', cookie).buffer(true).parse(replyBytes);

describe('the practice date format', () => {
  it('is day-month-year until the administrator changes it, and every user of the practice gets it', async () => {
    await put(settings('day-month-year'));
    const read = await ctx.http.get('/api/practice/session-settings').set('Cookie', cookies.dentist);
    expect(read.body).toEqual(settings('day-month-year'));

    const res = await put(settings('month-day-year'));
    expect(res.status).toBe(200);
    expect(res.body).toEqual(settings('month-day-year'));
    // A fresh sign-in and a session already open both carry it.
    const hygienist = await signIn(ctx, 'hygienist');
    for (const cookie of [hygienist, cookies.dentist]) {
      const me = await ctx.http.get('/api/auth/me').set('Cookie', cookie);
      expect(me.body.dateFormat).toBe('month-day-year');
    }
    // Another practice keeps its own.
    const other = await ctx.http.get('/api/auth/me').set('Cookie', cookies.otherPracticeDentist);
    expect(other.body.dateFormat).toBe('day-month-year');
    await put(settings('day-month-year'));
  });

  it('writes an audit row with the format before and after', async () => {
    await put(settings('day-month-year'));
    expect((await put(settings('year-month-day'))).status).toBe(200);
    const [event] = await ctx.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.recordType, 'Practice'), eq(auditEvents.outcome, 'allowed')))
      .orderBy(desc(auditEvents.at))
      .limit(1);
    expect(event.action).toBe('policy-change');
    expect(event.before).toMatchObject({ dateFormat: 'day-month-year' });
    expect(event.after).toMatchObject({ dateFormat: 'year-month-day' });
    await put(settings('day-month-year'));
  });

  it('refuses a format it does not know, or none, beside the field in plain words', async () => {
    for (const body of [settings('dd/mm/yy'), { idleSignOutMinutes: 15 }]) {
      const bad = await put(body);
      expect(bad.status).toBe(400);
      expect(bad.body.fields).toEqual({ dateFormat: 'Choose how dates are written' });
    }
  });
});

describe('documents printed in the practice format', () => {
  it('writes the date of birth, the print date and the clinical dates in the chosen order', async () => {
    const pid = await patientId(ctx.db, 'LL-1001');
    const [patient] = await ctx.db.select().from(patients).where(eq(patients.id, pid));
    const today = new Date().toISOString().slice(0, 10);
    for (const format of ['year-month-day', 'month-day-year', 'day-month-year'] as const) {
      await put(settings(format));
      const passport = await pdf(`/api/patients/${pid}/passport.pdf`, cookies.dentist);
      expect(passport.status).toBe(200);
      const text = await pdfText(passport.body as Buffer);
      expect(text, format).toContain(`born ${writeCalendarDate(patient.birthDate, format)}`);
      expect(text, format).toContain(`printed by Dr Ines Calloway on ${writeCalendarDate(today, format)}`);
      const summary = await pdf(`/api/patients/${pid}/referral-summary/pdf`, cookies.dentist);
      expect(await pdfText(summary.body as Buffer), format).toContain(`Prepared: ${writeCalendarDate(today, format)}`);
    }
    // The forms differ: 17 Apr 1961 is not Apr 17, 1961 is not 1961-04-17.
    const shown = new Set(
      (['day-month-year', 'month-day-year', 'year-month-day'] as const).map((f) =>
        writeCalendarDate(patient.birthDate, f),
      ),
    );
    expect(shown.size).toBe(3);
    // Six PDFs: on a loaded machine they take longer than one request's default 20 s.
  }, 60_000);
});

// Only the practice administrator writes the setting; everyone signed in reads it with the session.
describeRoleMatrix(
  () => ctx,
  [
    {
      route: 'PUT /api/practice/session-settings (date format)',
      method: 'put',
      path: () => '/api/practice/session-settings',
      body: () => settings('day-month-year'),
      expect: all(403, { practice_admin: 200 }),
    },
    {
      route: 'GET /api/auth/me (date format with the session)',
      path: () => '/api/auth/me',
      expect: all(200),
    },
  ],
);
