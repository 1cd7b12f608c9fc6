// The impression on its way to the lab (issue 16, item 4): the lab prescription PDF (parsed back
// with pdf-parse) names the digital impression's scan bodies with lots and its scan files; the
// e-mail to the lab attaches small scan files and, above LAB_MAIL_ATTACHMENT_LIMIT_BYTES, carries
// one time-limited signed link per file instead (refused once expired, and when altered).
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents } from '../src/db/schema/index.js';
import { LAB_MAIL_ATTACHMENT_LIMIT_BYTES, signLabFileLink } from '../src/impressions/lab-file-link.js';
import { binaryStl } from './support/mesh-fixtures.js';
import { until } from './support/recalls.js';
import { actorCookies } from './support/role-matrix.js';
import { scenarioTargets } from './support/scenario-targets.js';
import { type AccountKey, startTestApp, testEnv, type TestContext } from './support/test-app.js';
import { replyBytes } from './support/reply-bytes.js';
import { pdfText } from './support/pdf-text.js';

interface CaughtMail {
  headers: Record<string, string>;
  text: string;
  attachments: { filename: string; contentType: string; size: number }[];
}
const mailHttp = `http://127.0.0.1:${process.env.TT_MAIL_HTTP_PORT ?? 2580}/messages`;

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
let t: Awaited<ReturnType<typeof scenarioTargets>>;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await actorCookies(ctx);
  t = await scenarioTargets(ctx, cookies);
});
afterAll(() => ctx.close());

/** The reply's bytes (superagent's parser signature). */

/** A plan for Wendell's 15 and 16 with a lab address, its digital impression and the files given. */
async function digitalPlan(files: [Buffer, string][]) {
  const labEmail = `scans+${Date.now()}-${Math.random().toString(36).slice(2, 6)}@ferncliff-lab.example`;
  const sites = [t.ids.wendell15, t.ids.wendell16];
  const plan = await ctx.http
    .post('/api/restorations')
    .set('Cookie', cookies.dentist)
    .send({
      patientId: t.ids.wendell,
      kind: 'splinted-bridge',
      retention: 'screw-to-implant',
      material: 'zirconia',
      copingsSplinted: false,
      labName: 'Ferncliff Dental Lab',
      labEmail,
      sites: sites.map((siteId) => ({
        siteId,
        interface: 'non-engaging',
        impressionCoping: 'non-engaging',
        screwComponentIds: [t.tex('PSI')],
      })),
    });
  if (plan.status !== 201) throw new Error(`plan failed: ${plan.status} ${JSON.stringify(plan.body)}`);
  const impression = await ctx.http
    .post(`/api/restorations/${plan.body.id}/impressions`)
    .set('Cookie', cookies.dentist)
    .send({
      method: 'digital',
      takenOn: '2026-11-24',
      scanBodies: sites.map((siteId, i) => ({ siteId, componentId: t.tex('SB'), lot: `SB-LAB-${i + 15}` })),
    });
  if (impression.status !== 201) throw new Error(`impression failed: ${JSON.stringify(impression.body)}`);
  for (const [data, name] of files) {
    const res = await ctx.http
      .post(`/api/impressions/${impression.body.id}/scan-files?fileName=${encodeURIComponent(name)}`)
      .set('Cookie', cookies.dentist)
      .set('Content-Type', 'application/octet-stream')
      .send(data);
    if (res.status !== 201) throw new Error(`upload failed: ${res.status} ${JSON.stringify(res.body)}`);
  }
  return plan.body.id as string;
}

/** Asks for the prescription to be e-mailed and waits for the mail the catcher received. */
async function mailToLab(restorationId: string): Promise<CaughtMail> {
  const made = await ctx.http
    .post(`/api/restorations/${restorationId}/lab-prescriptions`)
    .set('Cookie', cookies.dentist)
    .send({ emailToLab: true });
  expect(made.status, JSON.stringify(made.body)).toBe(201);
  const caught = async () =>
    ((await (await fetch(mailHttp)).json()) as CaughtMail[]).filter(
      (m) => m.headers['x-torquetrail-lab-prescription'] === made.body.id,
    );
  const found = await until(async () => ((await caught()).length > 0 ? caught() : null), 20_000);
  return found[0];
}

/** A binary STL just over the attachment limit: the header, the count and zeroed triangles. */
function largeStl(): Buffer {
  const triangles = Math.ceil((LAB_MAIL_ATTACHMENT_LIMIT_BYTES - 84) / 50) + 1;
  const b = Buffer.alloc(84 + 50 * triangles);
  b.write('large invented scan', 0, 'latin1');
  b.writeUInt32LE(triangles, 80);
  return b;
}

describe('the impression on the lab prescription', () => {
  it('names the digital impression, the scan body and lot at each site, and each scan file', async () => {
    const small = binaryStl(2);
    const plan = await digitalPlan([[small, 'upper-right-scan.stl']]);
    const made = await ctx.http
      .post(`/api/restorations/${plan}/lab-prescriptions`)
      .set('Cookie', cookies.dentist)
      .send({});
    expect(made.status).toBe(201);
    const res = await ctx.http
      .get(`/api/lab-prescriptions/${made.body.id}/pdf`)
      .set('Cookie', cookies.dentist)
      .buffer(true)
      .parse(replyBytes);
    const text = await pdfText(res.body as Buffer);
    expect(text).toContain('Impression: digital (intraoral scan), taken 24 Nov 2026');
    expect(text).toMatch(/Scan body at 15 \(FDI\) \/ 4: Scan body, hand-tight \[[^\]]+-SB\], lot SB-LAB-15/);
    expect(text).toMatch(/Scan body at 16 \(FDI\) \/ 3: .*lot SB-LAB-16/);
    expect(text).toContain(`Scan file: upper-right-scan.stl (STL, ${Math.max(1, Math.round(small.length / 1000))} kB)`);
  });

  it('says which scan bodies are marked in the scan file, in the PDF and in the e-mail', async () => {
    const plan = await digitalPlan([[binaryStl(4), 'marked-scan.stl']]);
    const listed = await ctx.http.get(`/api/restorations/${plan}/impressions`).set('Cookie', cookies.dentist);
    const marked = await ctx.http
      .post(`/api/scan-files/${listed.body.scanFiles[0].id}/markers`)
      .set('Cookie', cookies.dentist)
      .send({ siteId: t.ids.wendell15, point: { x: 0.5, y: 0.5, z: 0 } });
    expect(marked.status, JSON.stringify(marked.body)).toBe(201);
    const made = await ctx.http
      .post(`/api/restorations/${plan}/lab-prescriptions`)
      .set('Cookie', cookies.dentist)
      .send({});
    const res = await ctx.http
      .get(`/api/lab-prescriptions/${made.body.id}/pdf`)
      .set('Cookie', cookies.dentist)
      .buffer(true)
      .parse(replyBytes);
    const text = await pdfText(res.body as Buffer);
    expect(text).toMatch(/Scan body at 15 \(FDI\) \/ 4: .*lot SB-LAB-15, marked in the scan file/);
    // 16 has no marker: nothing is said of it.
    expect(text).toMatch(/lot SB-LAB-16 Scan file/);
    const mail = await mailToLab(plan);
    expect(mail.text).toContain('The scan bodies at 15 (FDI) are marked in the scan file.');
  });

  it('e-mails small scan files as attachments beside the PDF', async () => {
    const small = binaryStl(3);
    const mail = await mailToLab(await digitalPlan([[small, 'small-scan.stl']]));
    expect(mail.headers['x-torquetrail-scan-files']).toBe('attached');
    expect(mail.attachments.map((a) => [a.filename, a.size])).toContainEqual(['small-scan.stl', small.length]);
    expect(mail.text).not.toMatch(/\/api\/lab-files\//);
  });

  it('links large scan files for a limited time instead: the link opens the file, audited; expired it is 410', async () => {
    const large = largeStl();
    const mail = await mailToLab(await digitalPlan([[large, 'full-arch-scan.stl']]));
    expect(mail.headers['x-torquetrail-scan-files']).toBe('linked');
    expect(mail.attachments.map((a) => a.filename)).toEqual(['lab-prescription-LL-1005.pdf']);
    const link = /https?:\/\/\S+(\/api\/lab-files\/([\w-]+\.[\w-]+))/.exec(mail.text);
    expect(link, mail.text).not.toBeNull();
    const [, path, token] = link!;

    const got = await ctx.http.get(path).buffer(true).parse(replyBytes);
    expect(got.status).toBe(200);
    expect((got.body as Buffer).length).toBe(large.length);
    expect(got.headers['content-disposition']).toContain('full-arch-scan.stl');
    const audited = await ctx.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.route, 'GET /lab-files/:token'), eq(auditEvents.patientId, t.ids.wendell)));
    expect(audited.length).toBeGreaterThan(0);
    expect(audited[0]).toMatchObject({ action: 'export', outcome: 'allowed', userId: null });

    // The same file, signed with the app's secret but expired a second ago: gone.
    const scanFileId = Buffer.from(token.split('.')[0], 'base64url').toString().split('.')[0];
    const expired = signLabFileLink(testEnv().JWT_SECRET, scanFileId, new Date(Date.now() - 1000));
    const late = await ctx.http.get(`/api/lab-files/${expired}`);
    expect(late.status).toBe(410);
    expect(late.body.message).toMatch(/expired/);
    // One character changed in the signature: not a link at all.
    const at = token.indexOf('.') + 6;
    const altered = `${token.slice(0, at)}${token[at] === 'A' ? 'B' : 'A'}${token.slice(at + 1)}`;
    expect((await ctx.http.get(`/api/lab-files/${altered}`)).status).toBe(404);
  });
});
