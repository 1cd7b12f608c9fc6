// The referral summary: the PDF parsed back with pdf-parse, e-mailed to the share's surgeon as an
// attachment through the job queue and the SMTP catcher, once per press (idempotency key), and
// listed in the audit trail. SMTP down: referral-summary-smtp-down.e2e-spec.ts.
import { eq, sql } from 'drizzle-orm';
import { writeCalendarDate } from '@torquetrail/contracts';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { patientShares, referralSummaryMails } from '../src/db/schema/index.js';
import { until } from './support/recalls.js';
import { ACCOUNTS, patientId, signInAll, startTestApp, type TestContext } from './support/test-app.js';
import { replyBytes } from './support/reply-bytes.js';
import { pdfText as readPdfText } from './support/pdf-text.js';

/** The demo practice writes dates day-month-year (its default). */
const dmy = (iso: string) => writeCalendarDate(iso, 'day-month-year');

interface Caught {
  headers: Record<string, string>;
  envelopeTo: string[];
  subject: string;
  attachments: { filename: string; contentType: string; size: number }[];
}
const mailHttp = `http://127.0.0.1:${process.env.TT_MAIL_HTTP_PORT ?? 2580}/messages`;
const caughtFor = async (id: string) =>
  ((await (await fetch(mailHttp)).json()) as Caught[]).filter(
    (m) => m.headers['x-torquetrail-referral-summary'] === id,
  );

let ctx: TestContext;
let cookies: Awaited<ReturnType<typeof signInAll>>;
let harold: string;
let share: string;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await signInAll(ctx);
  harold = await patientId(ctx.db, 'LL-1001');
  [{ id: share }] = await ctx.db
    .select({ id: patientShares.id })
    .from(patientShares)
    .where(eq(patientShares.patientId, harold));
});
afterAll(() => ctx.close());

const pdfText = async (who: keyof typeof cookies, patient: string) => {
  const res = await ctx.http
    .get(`/api/patients/${patient}/referral-summary/pdf`)
    .set('Cookie', cookies[who])
    .buffer(true)
    .parse(replyBytes);
  if (res.status !== 200) return { status: res.status, text: '' };
  return { status: res.status, text: await readPdfText(res.body as Buffer), res };
};

describe('referral summary PDF', () => {
  it('holds placement, restoration, parts, last recall and bone-level trend of each implant', async () => {
    const { status, text, res } = await pdfText('dentist', harold);
    expect(status).toBe(200);
    expect(res!.headers['content-disposition']).toBe('attachment; filename="referral-summary-LL-1001.pdf"');
    expect(text).toContain('Referral summary: implants');
    expect(text).toContain('Larkspur Lane Dental');
    expect(text).toContain('Patient: Harold Whitcombe');
    expect(text).toContain('chart LL-1001');
    // FDI 35 → Universal 20, 36 → 19 (HL7 ADA Universal table).
    expect(text).toContain('Site 35 (FDI) / 20 (Universal): in function');
    expect(text).toContain(`Site 36 (FDI) / 19 (Universal): failed on ${dmy('2012-06-05')}`);
    expect(text).toContain(
      `Placed ${dmy('2012-03-14')} by Dr Rafael Imbert (Northgate Oral Surgery): Solvra CN (Solvra Dental)`,
    );
    expect(text).toContain('lot SCN4310-12A07');
    expect(text).toContain(
      `Restoration delivered ${dmy('2012-09-20')}: splinted bridge, screw to implant, zirconia; retrievable`,
    );
    expect(text).toContain('lot PSI-1209-33');
    expect(text).toMatch(/Last recall: health on \d{1,2} [A-Z][a-z]{2,3} \d{4}/);
    expect(text).toMatch(/Bone level \(mm from the platform\): \d{1,2} [A-Z][a-z]{2,3} \d{4} \d+\.\d mm/);
    // Seeded readings start at the first recall after loading: 0.8 mm then, 1.1 mm at the latest.
    expect(text).toMatch(/Change since loading \(from the reading of \d{1,2} [A-Z][a-z]{2,3} \d{4}\): loss of 0\.3 mm/);
  });

  it('a cemented crown is "not retrievable"; the shared surgeon may download, the hygienist may not', async () => {
    const okafor = await pdfText('dentist', await patientId(ctx.db, 'LL-1003'));
    expect(okafor.text).toContain('not retrievable without cutting (cemented)');
    expect(okafor.text).toMatch(/Last recall: peri implantitis on/);
    expect((await pdfText('surgeon', harold)).status).toBe(200);
    expect((await pdfText('surgeon', await patientId(ctx.db, 'LL-1003'))).status).toBe(404);
    expect((await pdfText('hygienist', harold)).status).toBe(403);
    expect((await pdfText('otherPracticeDentist', harold)).status).toBe(404);
  });
});

describe('referral summary e-mail', () => {
  it('is sent to the surgeon once per press, with the PDF attached, and audited', { timeout: 60_000 }, async () => {
    const state = await ctx.http.get(`/api/patients/${harold}/referral-summary`).set('Cookie', cookies.dentist);
    expect(state.body.recipients).toEqual([
      { shareId: share, surgeonName: 'Dr Rafael Imbert', practiceName: 'Northgate Oral Surgery' },
    ]);
    const key = crypto.randomUUID();
    const send = () =>
      ctx.http
        .post(`/api/patients/${harold}/referral-summary/mails`)
        .set('Cookie', cookies.dentist)
        .send({ shareId: share, idempotencyKey: key });
    // Pressed twice at once: one request.
    const [a, b] = await Promise.all([send(), send()]);
    expect([a.status, b.status]).toEqual([201, 201]);
    expect(b.body.id).toBe(a.body.id);
    expect(a.body).toMatchObject({ shareId: share, sentTo: ACCOUNTS.surgeon });
    const mail = await until(
      async () => ((await caughtFor(a.body.id)).length > 0 ? caughtFor(a.body.id) : null),
      30_000,
    );
    expect(mail).toHaveLength(1);
    expect(mail[0].envelopeTo).toEqual([ACCOUNTS.surgeon]);
    expect(mail[0].subject).toBe('Referral summary LL-1001 from Larkspur Lane Dental');
    expect(mail[0].attachments).toEqual([
      expect.objectContaining({ filename: 'referral-summary-LL-1001.pdf', contentType: 'application/pdf' }),
    ]);
    expect(mail[0].attachments[0].size).toBeGreaterThan(1000);
    const [row] = await until(async () => {
      const rows = await ctx.db.select().from(referralSummaryMails).where(eq(referralSummaryMails.id, a.body.id));
      return rows[0]?.status === 'sent' ? rows : null;
    }, 10_000);
    expect(row.attempts).toBe(1);
    // Pressed again later with the same key: the same request, nothing sent again.
    const again = await send();
    expect(again.body).toMatchObject({ id: a.body.id, status: 'sent' });
    await new Promise((r) => setTimeout(r, 1500));
    expect(await caughtFor(a.body.id)).toHaveLength(1);
    const audit = await ctx.db.execute<{ action: string; record_type: string; patient_id: string }>(
      sql`select action, record_type, patient_id from audit_events where record_id = ${a.body.id} and outcome = 'allowed'`,
    );
    expect(audit.rows[0]).toEqual({ action: 'create', record_type: 'ReferralSummaryMail', patient_id: harold });
    // On the Timeline of each of the patient's sites.
    const site = await ctx.db.execute<{ id: string }>(
      sql`select id from implant_sites where patient_id = ${harold} and fdi = 37`,
    );
    const timeline = await ctx.http.get(`/api/sites/${site.rows[0].id}/timeline`).set('Cookie', cookies.dentist);
    expect(timeline.body.events).toContainEqual(
      expect.objectContaining({
        kind: 'referral-summary',
        id: a.body.id,
        title: 'Referral summary e-mailed',
        detail: `to ${ACCOUNTS.surgeon}`,
        byName: 'Dr Ines Calloway',
      }),
    );
    const listed = await ctx.http.get(`/api/patients/${harold}/referral-summary`).set('Cookie', cookies.surgeon);
    expect(listed.body.mails.map((m: { id: string }) => m.id)).toContain(a.body.id);
  });

  it('refuses a share of another patient, a surgeon sender, and a malformed key', async () => {
    const lucia = await patientId(ctx.db, 'LL-1004');
    const wrong = await ctx.http
      .post(`/api/patients/${lucia}/referral-summary/mails`)
      .set('Cookie', cookies.dentist)
      .send({ shareId: share, idempotencyKey: crypto.randomUUID() });
    expect(wrong.status).toBe(400);
    expect(wrong.body.fields).toHaveProperty('shareId');
    const surgeon = await ctx.http
      .post(`/api/patients/${harold}/referral-summary/mails`)
      .set('Cookie', cookies.surgeon)
      .send({ shareId: share, idempotencyKey: crypto.randomUUID() });
    expect(surgeon.status).toBe(403);
    const bad = await ctx.http
      .post(`/api/patients/${harold}/referral-summary/mails`)
      .set('Cookie', cookies.dentist)
      .send({ shareId: share, idempotencyKey: 'twice' });
    expect(bad.status).toBe(400);
    expect(bad.body.fields).toHaveProperty('idempotencyKey');
  });
});
