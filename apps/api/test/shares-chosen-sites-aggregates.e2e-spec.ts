// A share of chosen sites opens those sites in what is computed from many, too (issue 12): the
// surgeon's outcomes count only the shared sites in their curves and rates, and the referral
// summary, downloaded or e-mailed, draws only the shared sites. The replies walk
// (shares-replies.e2e-spec.ts) covers record replies; these are aggregates and files it cannot see.
import { and, eq } from 'drizzle-orm';
import type { OutcomesReply } from '@torquetrail/contracts';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { patientShares, users } from '../src/db/schema/index.js';
import { ACCOUNTS, patientId, signInAll, siteId, startTestApp, type TestContext } from './support/test-app.js';
import { replyBytes } from './support/reply-bytes.js';
import { pdfText as readPdfText } from './support/pdf-text.js';

let ctx: TestContext;
let cookies: Awaited<ReturnType<typeof signInAll>>;
let harold: string;
let site35: string;

beforeAll(async () => {
  ctx = await startTestApp();
  harold = await patientId(ctx.db, 'LL-1001');
  site35 = await siteId(ctx.db, 'LL-1001', 35);
  const [surgeon] = await ctx.db.select({ id: users.id }).from(users).where(eq(users.email, ACCOUNTS.surgeon));
  // Harold's share with the surgeon opens site 35 only (he also has implants at 36 and 37).
  await ctx.db
    .update(patientShares)
    .set({ siteIds: [site35], scopes: ['placement', 'outcomes'] })
    .where(and(eq(patientShares.patientId, harold), eq(patientShares.sharedWithUserId, surgeon.id)));
  cookies = await signInAll(ctx);
});
afterAll(() => ctx?.close());

const pdfText = async (cookie: string) => {
  const res = await ctx.http
    .get(`/api/patients/${harold}/referral-summary/pdf`)
    .set('Cookie', cookie)
    .buffer(true)
    .parse(replyBytes);
  expect(res.status).toBe(200);
  return readPdfText(res.body as Buffer);
};

describe('a share of chosen sites, in aggregates and files', () => {
  it('outcomes: the curves count exactly the implants listed, and of Harold only site 35', async () => {
    const res = await ctx.http.get('/api/outcomes').set('Cookie', cookies.surgeon);
    expect(res.status).toBe(200);
    const body = res.body as OutcomesReply;
    const harolds = body.implants.filter((i) => i.chartNumber === 'LL-1001').map((i) => i.fdi);
    expect(harolds).toEqual([35]);
    const counted = body.curves.reduce((n, c) => n + c.subjects, 0) + body.withoutEndDate;
    expect(counted).toBe(body.total);
    expect(body.total).toBe(body.implants.length);
  });

  it('referral summary: the surgeon’s download draws site 35 only; the practice’s draws every site', async () => {
    const surgeon = await pdfText(cookies.surgeon);
    expect(surgeon).toContain('Site 35 (FDI)');
    expect(surgeon).not.toContain('Site 36 (FDI)');
    expect(surgeon).not.toContain('Site 37 (FDI)');
    const dentist = await pdfText(cookies.dentist);
    expect(dentist).toContain('Site 35 (FDI)');
    expect(dentist).toContain('Site 36 (FDI)');
  });
});
