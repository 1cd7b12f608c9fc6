// The lab prescription PDF: generated with pdfkit, stored in S3, parsed back with pdf-parse to
// check it holds the component chain, and e-mailed to the lab through the SMTP catcher.
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { labPrescriptions, placements, practices } from '../src/db/schema/index.js';
import { larkspurId, parts } from './support/ledger-fixtures.js';
import type { LabPrescriptionSummary } from '@torquetrail/contracts';
import { until } from './support/recalls.js';
import { patientId, signIn, siteId, startTestApp, type TestContext } from './support/test-app.js';
import { replyBytes } from './support/reply-bytes.js';
import { pdfText } from './support/pdf-text.js';

interface CaughtLabMail {
  headers: Record<string, string>;
  envelopeTo: string[];
  attachments: { filename: string; contentType: string }[];
}

const mailHttp = `http://127.0.0.1:${process.env.TT_MAIL_HTTP_PORT ?? 2580}/messages`;

let ctx: TestContext;
let dentist: string;
let planId: string;
beforeAll(async () => {
  ctx = await startTestApp();
  dentist = await signIn(ctx, 'dentist');
  const part = await parts(ctx.db, await larkspurId(ctx.db), 'Tessely EX 4.1');
  const sites = [await siteId(ctx.db, 'LL-1005', 15), await siteId(ctx.db, 'LL-1005', 16)];
  const ok = await ctx.http
    .post('/api/restorations')
    .set('Cookie', dentist)
    .send({
      patientId: await patientId(ctx.db, 'LL-1005'),
      kind: 'splinted-bridge',
      retention: 'screw-to-implant',
      material: 'zirconia',
      shade: 'A3',
      copingsSplinted: true,
      labName: 'Ferncliff Dental Lab',
      labEmail: `orders+${Date.now()}@ferncliff-lab.example`,
      dueOn: '2026-12-18',
      sites: sites.map((s) => ({
        siteId: s,
        interface: 'non-engaging',
        impressionCoping: 'non-engaging',
        screwComponentIds: [part('PSI')],
        impressionCopingComponentId: part('ICN-O'),
      })),
    });
  if (ok.status !== 201) throw new Error(`the plan was not saved: ${JSON.stringify(ok.body)}`);
  planId = ok.body.id;
});
afterAll(() => ctx.close());

describe('lab prescription', () => {
  it('holds the practice, the patient by chart number and initials only, both numberings and the full component chain', async () => {
    const made = await ctx.http.post(`/api/restorations/${planId}/lab-prescriptions`).set('Cookie', dentist).send({});
    expect(made.status).toBe(201);
    const [row] = await ctx.db.select().from(labPrescriptions).where(eq(labPrescriptions.id, made.body.id));
    expect(row.objectKey).toMatch(new RegExp(`^practices/[0-9a-f-]{36}/lab-prescriptions/${made.body.id}\\.pdf$`));
    expect(row.sizeBytes).toBe(made.body.sizeBytes);

    const res = await ctx.http
      .get(`/api/lab-prescriptions/${made.body.id}/pdf`)
      .set('Cookie', dentist)
      .buffer(true)
      .parse(replyBytes);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const body = await pdfText(res.body as Buffer);
    expect(body).toContain('Larkspur Lane Dental');
    expect(body).toContain('LL-1005 (W. A.)');
    expect(body).not.toContain('Achterberg');
    expect(body).not.toContain('Wendell');
    // FDI 15 → Universal 4, FDI 16 → Universal 3 (HL7 ADA Universal table).
    expect(body).toContain('Site 15 (FDI) / 4 (Universal)');
    expect(body).toContain('Site 16 (FDI) / 3 (Universal)');
    // The implant's length beside its diameter (the lab orders the analog and checks the space by it).
    const [length15] = await ctx.db
      .select({ mm: placements.lengthMm })
      .from(placements)
      .where(eq(placements.siteId, await siteId(ctx.db, 'LL-1005', 15)));
    expect(body).toContain(
      `Tessely EX (Tessely Medical), platform Tessely EX 4.1, 4.1 × ${length15.mm} mm (diameter × length), external hex connection`,
    );
    // The prescription number the lab quotes, and the practice's address and phone to quote it to.
    expect(made.body.number).toBe(row.number);
    expect(body).toContain(`Prescription no. ${row.number}`);
    const [practice] = await ctx.db.select().from(practices).where(eq(practices.id, row.practiceId));
    for (const line of practice.address!.split('\n')) expect(body).toContain(line.trim());
    expect(body).toContain(`Phone ${practice.phone}`);
    expect(body).toContain('Prosthetic screw, implant level [TEX-41-PSI]: 32 N·cm ±10 %');
    // A long line may wrap after a hyphen of a reference code: joined again before comparing.
    expect(body.replace(/(\[[A-Z0-9-]*-) /g, '$1')).toContain(
      'Impression technique: non-engaging coping; Impression coping, non-engaging, open tray [TEX-41-ICN-O]',
    );
    expect(body).toContain('copings splinted together before the impression');
    expect(body).toContain('Material: Zirconia Shade: A3');
    expect(body).toContain('Due: 18 Dec 2026'); // in the practice's date format (day-month-year by default)
    expect(body).toContain('Signature');
    expect(body).toContain('Dr Ines Calloway');
    expect(body).toMatch(/manufacturer's instructions/);
  });

  it('e-mails it to the lab through the job queue with the PDF attached, once, and records when', async () => {
    const made = await ctx.http
      .post(`/api/restorations/${planId}/lab-prescriptions`)
      .set('Cookie', dentist)
      .send({ emailToLab: true });
    expect(made.status).toBe(201);
    expect(made.body.lastEmail.to).toMatch(/@ferncliff-lab\.example$/);
    const caught = async () =>
      ((await (await fetch(mailHttp)).json()) as CaughtLabMail[]).filter(
        (m) => m.headers['x-torquetrail-lab-prescription'] === made.body.id,
      );
    const found = await until(async () => ((await caught()).length > 0 ? caught() : null), 15_000);
    expect(found).toHaveLength(1);
    expect(found[0].envelopeTo).toEqual([made.body.lastEmail.to]);
    expect(found[0].attachments).toEqual([
      expect.objectContaining({ filename: 'lab-prescription-LL-1005.pdf', contentType: 'application/pdf' }),
    ]);
    const listed = await until(async () => {
      const plan = (await ctx.http.get(`/api/restorations/${planId}`).set('Cookie', dentist)).body;
      const mine = (plan.labPrescriptions as LabPrescriptionSummary[]).find((p) => p.id === made.body.id);
      return mine?.emailedAt ? mine : null;
    }, 10_000);
    expect(listed.emailedTo).toBe(made.body.lastEmail.to);
    expect(listed.lastEmail?.status).toBe('sent');
    // Delivered exactly once: a later sweep or a retry of the same request sends nothing more.
    await new Promise((r) => setTimeout(r, 1500));
    expect(await caught()).toHaveLength(1);
  });

  it('pressing again re-uses the latest prescription (no second PDF); revise makes a new version', async () => {
    const first = await ctx.http.post(`/api/restorations/${planId}/lab-prescriptions`).set('Cookie', dentist).send({});
    const again = await ctx.http.post(`/api/restorations/${planId}/lab-prescriptions`).set('Cookie', dentist).send({});
    expect([first.status, again.status]).toEqual([201, 201]);
    expect(again.body.id).toBe(first.body.id);
    const rows = async () =>
      (await ctx.db.select().from(labPrescriptions).where(eq(labPrescriptions.restorationId, planId))).length;
    const before = await rows();
    const revised = await ctx.http
      .post(`/api/restorations/${planId}/lab-prescriptions`)
      .set('Cookie', dentist)
      .send({ revise: true });
    expect(revised.status).toBe(201);
    expect(revised.body.id).not.toBe(first.body.id);
    expect(await rows()).toBe(before + 1);
    const next = await ctx.http.post(`/api/restorations/${planId}/lab-prescriptions`).set('Cookie', dentist).send({});
    expect(next.body.id).toBe(revised.body.id);
  });

  it('two presses at once write one prescription; a revision gets the next number', async () => {
    const plan = await ctx.http
      .get(`/api/patients/${await patientId(ctx.db, 'LL-1001')}/restorations`)
      .set('Cookie', dentist);
    const id = plan.body.items[0].id as string;
    const count = async () =>
      (await ctx.db.select().from(labPrescriptions).where(eq(labPrescriptions.restorationId, id))).length;
    const before = await count();
    const [a, b] = await Promise.all(
      [1, 2].map(() => ctx.http.post(`/api/restorations/${id}/lab-prescriptions`).set('Cookie', dentist).send({})),
    );
    expect([a.status, b.status]).toEqual([201, 201]);
    expect(a.body.id).toBe(b.body.id);
    expect(await count()).toBe(before === 0 ? 1 : before);
    const revised = await ctx.http
      .post(`/api/restorations/${id}/lab-prescriptions`)
      .set('Cookie', dentist)
      .send({ revise: true });
    expect(revised.body.number).toBeGreaterThan(a.body.number as number);
  });

  it("numbers run per practice: a revision takes its practice's next number, other practices' stay", async () => {
    const counters = async () =>
      new Map(
        (await ctx.db.select({ id: practices.id, n: practices.labPrescriptionCounter }).from(practices)).map((p) => [
          p.id,
          p.n,
        ]),
      );
    const larkspur = await larkspurId(ctx.db);
    const before = await counters();
    const revised = await ctx.http
      .post(`/api/restorations/${planId}/lab-prescriptions`)
      .set('Cookie', dentist)
      .send({ revise: true });
    expect(revised.status).toBe(201);
    expect(revised.body.number).toBe(before.get(larkspur)! + 1);
    const after = await counters();
    expect(after).toEqual(new Map([...before, [larkspur, before.get(larkspur)! + 1]]));
    // The database holds a number unique within its practice only (the same number may recur elsewhere).
    const constraint = await ctx.db.execute<{ def: string }>(
      sql`select pg_get_constraintdef(oid) as def from pg_constraint where conname = 'lab_prescriptions_practice_number_unique'`,
    );
    expect(constraint.rows[0].def).toBe('UNIQUE (practice_id, number)');
  });

  it('refuses to e-mail a plan without a lab address (400 on emailToLab)', async () => {
    const bridge = (
      await ctx.http.get(`/api/patients/${await patientId(ctx.db, 'LL-1001')}/restorations`).set('Cookie', dentist)
    ).body.items[0];
    const res = await ctx.http
      .post(`/api/restorations/${bridge.id}/lab-prescriptions`)
      .set('Cookie', dentist)
      .send({ emailToLab: true });
    expect(res.status).toBe(400);
    expect(res.body.fields).toHaveProperty('emailToLab');
  });
});
