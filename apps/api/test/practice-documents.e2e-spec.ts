// The practice's contact as its administrator sets it (validated, audited) and as every document
// prints it; and every PDF the product writes set in embedded Noto Sans, so a name beyond
// Windows-1252 ("Łucja Ødegård-Nguyễn") comes back out of the extracted text letter for letter and
// no standard-14 Helvetica is left in the file.
import { and, desc, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents, patients, practices } from '../src/db/schema/index.js';
import { patientId, signInAll, startTestApp, type TestContext } from './support/test-app.js';
import { replyBytes } from './support/reply-bytes.js';
import { pdfText } from './support/pdf-text.js';

let ctx: TestContext;
let cookies: Awaited<ReturnType<typeof signInAll>>;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await signInAll(ctx);
});
afterAll(() => ctx.close());

const binary = (method: 'get' | 'post', path: string, cookie: string) =>
  ctx.http[method](path).set('Cookie', cookie).buffer(true).parse(replyBytes);

const CONTACT = {
  address: 'ul. Żółkiewskiego 7\n90-001 Łódź',
  phone: '+48 42 555 01 23',
  email: 'recepcja@larkspur-lane.example',
};
const NAME = { givenName: 'Łucja', familyName: 'Ødegård-Nguyễn' };

/** Every document of one patient, after the contact and the name above are set. */
async function documentsOf(chart: string): Promise<Record<string, Buffer>> {
  const pid = await patientId(ctx.db, chart);
  await ctx.db.update(patients).set(NAME).where(eq(patients.id, pid));
  const put = await ctx.http.put('/api/practice/contact').set('Cookie', cookies.practice_admin).send(CONTACT);
  expect(put.status).toBe(200);
  const plans = await ctx.http.get(`/api/patients/${pid}/restorations`).set('Cookie', cookies.dentist);
  const lab = await ctx.http
    .post(`/api/restorations/${plans.body.items[0].id}/lab-prescriptions`)
    .set('Cookie', cookies.dentist)
    .send({ revise: true });
  expect(lab.status).toBe(201);
  const docs: Record<string, Buffer> = {};
  for (const [name, path] of [
    ['passport', `/api/patients/${pid}/passport.pdf`],
    ['retrieval card', `/api/patients/${pid}/retrieval-card.pdf`],
    ['referral summary', `/api/patients/${pid}/referral-summary/pdf`],
    ['lab prescription', `/api/lab-prescriptions/${lab.body.id}/pdf`],
  ] as const) {
    const res = await binary('get', path, cookies.dentist);
    expect(res.status, name).toBe(200);
    docs[name] = res.body as Buffer;
  }
  return docs;
}

describe('the practice contact', () => {
  it('is set by the practice administrator, read back, and audited with before and after', async () => {
    const res = await ctx.http.put('/api/practice/contact').set('Cookie', cookies.practice_admin).send(CONTACT);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ name: 'Larkspur Lane Dental', ...CONTACT });
    const read = await ctx.http.get('/api/practice/contact').set('Cookie', cookies.dentist);
    expect(read.body).toEqual(res.body);
    const [event] = await ctx.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.recordType, 'Practice'), eq(auditEvents.outcome, 'allowed')))
      .orderBy(desc(auditEvents.at))
      .limit(1);
    expect(event.action).toBe('policy-change');
    expect(event.after).toMatchObject(CONTACT);
  });

  it('refuses a wrong e-mail or phone beside the field, and empties a field with null', async () => {
    const bad = await ctx.http
      .put('/api/practice/contact')
      .set('Cookie', cookies.practice_admin)
      .send({ address: null, phone: 'call us', email: 'not-an-address' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.fields).sort()).toEqual(['email', 'phone']);
    const cleared = await ctx.http
      .put('/api/practice/contact')
      .set('Cookie', cookies.practice_admin)
      .send({ address: null, phone: null, email: null });
    expect(cleared.status).toBe(200);
    const [row] = await ctx.db.select().from(practices).where(eq(practices.name, 'Larkspur Lane Dental'));
    expect([row.address, row.phone, row.email]).toEqual([null, null, null]);
  });

  it('may be changed by the practice administrator only', async () => {
    for (const who of ['dentist', 'hygienist', 'surgeon'] as const) {
      const res = await ctx.http.put('/api/practice/contact').set('Cookie', cookies[who]).send(CONTACT);
      expect(res.status, who).toBe(403);
    }
  });
});

describe('every PDF the product writes', () => {
  it('prints the contact and keeps a non-Latin-1 name intact, in embedded Noto Sans without Helvetica', async () => {
    const docs = await documentsOf('LL-1001');
    for (const [name, pdf] of Object.entries(docs)) {
      const raw = pdf.toString('latin1');
      expect(raw, name).not.toMatch(/\/BaseFont\s*\/Helvetica/);
      expect(raw, name).toMatch(/\/BaseFont\s*\/[A-Z]{6}\+NotoSans/);
      expect(raw, name).toContain('/FontFile2');
      const text = await pdfText(pdf);
      expect(text, name).toContain('ul. Żółkiewskiego 7');
      expect(text, name).toContain('90-001 Łódź');
      expect(text, name).toContain('Phone +48 42 555 01 23');
      expect(text, name).toContain('E-mail recepcja@larkspur-lane.example');
      // The lab sees initials only (the patient's name stays in the practice).
      const patientShown = name === 'lab prescription' ? '(Ł. Ø.)' : 'Łucja Ødegård-Nguyễn';
      expect(text, name).toContain(patientShown);
    }
  });
});
