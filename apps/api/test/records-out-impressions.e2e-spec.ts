// Impressions in the records that leave the practice (issue 16, items 4 and 5): the FHIR bundle
// carries each impression as a Procedure (performed on the day it was taken), a Device per coping
// or scan body with its lot, and a DocumentReference per scan file, checked by the `fhir`
// package's validator as the other exports are; the implant passport lists the impression.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeCalendarDate } from '@torquetrail/contracts';
import { eq } from 'drizzle-orm';
import { impressionScanBodies, impressions, scanFiles } from '../src/db/schema/index.js';
import { derivedId } from '../src/records-out/fhir-bundle.js';
import { validatorErrors } from './support/fhir-validation.js';
import { larkspurId, parts, patientWithImplants } from './support/ledger-fixtures.js';
import { patientId, signIn, startTestApp, type TestContext } from './support/test-app.js';
import { replyBytes } from './support/reply-bytes.js';
import { pdfPageTexts } from './support/pdf-text.js';

let ctx: TestContext;
let dentist: string;
beforeAll(async () => {
  ctx = await startTestApp();
  dentist = await signIn(ctx, 'dentist');
});
afterAll(() => ctx.close());

const binary = (path: string) => ctx.http.get(path).set('Cookie', dentist).buffer(true).parse(replyBytes);

type Resource = Record<string, unknown> & { resourceType: string; id: string };
async function bundleOf(pid: string): Promise<Resource[]> {
  const res = await binary(`/api/patients/${pid}/fhir`);
  expect(res.status).toBe(200);
  const bundle = JSON.parse((res.body as Buffer).toString('utf8'));
  expect(validatorErrors(bundle)).toEqual([]);
  return (bundle.entry as { fullUrl: string; resource: Resource }[]).map((e) => {
    expect(e.fullUrl).toBe(`urn:uuid:${e.resource.id}`);
    return e.resource;
  });
}

async function passportText(pid: string) {
  const res = await binary(`/api/patients/${pid}/passport.pdf`);
  expect(res.status).toBe(200);
  return (await pdfPageTexts(res.body as Buffer)).join(' ');
}

describe('a digital impression (the seeded one of LL-1005, scan bodies at 15 and 16, one STL file)', () => {
  it('is a Procedure on the day taken, a Device per scan body with its lot, a DocumentReference per scan file', async () => {
    const pid = await patientId(ctx.db, 'LL-1005');
    const [impression] = await ctx.db.select().from(impressions).where(eq(impressions.patientId, pid));
    const bodies = await ctx.db
      .select()
      .from(impressionScanBodies)
      .where(eq(impressionScanBodies.impressionId, impression.id));
    const [file] = await ctx.db.select().from(scanFiles).where(eq(scanFiles.impressionId, impression.id));
    expect(bodies).toHaveLength(2);

    const resources = await bundleOf(pid);
    const procedure = resources.find((r) => r.id === derivedId('impression-procedure', impression.id))!;
    expect(procedure).toMatchObject({
      resourceType: 'Procedure',
      status: 'completed',
      performedDateTime: impression.takenOn,
      subject: { reference: `urn:uuid:${pid}` },
      code: { coding: [{ code: 'implant-impression-digital' }] },
      report: [{ reference: `urn:uuid:${file.id}` }],
    });
    expect((procedure.bodySite as { coding: { code: string }[] }[]).map((b) => b.coding[0].code)).toEqual(['15', '16']);

    for (const b of bodies) {
      const device = resources.find((r) => r.id === derivedId('impression-part', b.id))!;
      expect(device).toMatchObject({ resourceType: 'Device', status: 'inactive', lotNumber: b.lot });
      expect(device.type).toMatchObject({ coding: [{ code: 'scan-body' }] });
      // The procedure names each scan body as used and removed.
      expect(procedure.focalDevice).toContainEqual({
        action: expect.objectContaining({ coding: [expect.objectContaining({ code: 'manipulated' })] }),
        manipulated: { reference: `urn:uuid:${device.id}` },
      });
    }

    const document = resources.find((r) => r.id === file.id)!;
    expect(document).toMatchObject({
      resourceType: 'DocumentReference',
      status: 'current',
      subject: { reference: `urn:uuid:${pid}` },
      identifier: [{ value: file.sha256 }],
      content: [{ attachment: { contentType: 'model/stl', size: file.sizeBytes, title: file.originalName } }],
      context: { related: [{ reference: `urn:uuid:${procedure.id}` }] },
    });
  });

  it('is listed in the implant passport with its scan bodies, lots and scan file', async () => {
    const pid = await patientId(ctx.db, 'LL-1005');
    const [impression] = await ctx.db.select().from(impressions).where(eq(impressions.patientId, pid));
    const text = await passportText(pid);
    expect(text).toContain('Impressions taken for your restorations');
    expect(text).toContain(
      `On ${writeCalendarDate(impression.takenOn, 'day-month-year')}, a digital impression (an intraoral scan, with a scan body screwed on each implant), at site 15, 16 (FDI)`,
    );
    expect(text).toMatch(/Scan body at site 15, used and removed: Scan body, hand-tight \[TEX-41-SB\], lot SBX41-2615/);
    expect(text).toMatch(/Scan file kept by the practice: upper-right-15-16\.stl \(STL, \d+ kB\)/);
  });
});

describe('an analog impression recorded over HTTP', () => {
  it('is a Procedure with a Device per impression coping, and the passport lists it', async () => {
    const practiceId = await larkspurId(ctx.db);
    const { patientId: pid, siteIds } = await patientWithImplants(ctx, 'T-RI1', 'Solvra CN 4.3', [{ fdi: 36 }]);
    const part = await parts(ctx.db, practiceId, 'Solvra CN 4.3');
    const planned = await ctx.http
      .post('/api/restorations')
      .set('Cookie', dentist)
      .send({
        patientId: pid,
        kind: 'single-crown',
        retention: 'screw-to-implant',
        material: 'zirconia',
        sites: [
          {
            siteId: siteIds[36],
            interface: 'engaging',
            impressionCoping: 'engaging',
            screwComponentIds: [part('PSI')],
            impressionCopingComponentId: part('ICE-C'),
          },
        ],
      });
    expect(planned.status, JSON.stringify(planned.body)).toBe(201);
    const taken = await ctx.http
      .post(`/api/restorations/${planned.body.id}/impressions`)
      .set('Cookie', dentist)
      .send({ method: 'analog', takenOn: '2026-11-20' });
    expect(taken.status, JSON.stringify(taken.body)).toBe(201);

    const resources = await bundleOf(pid);
    const procedure = resources.find((r) => r.id === derivedId('impression-procedure', taken.body.id))!;
    expect(procedure).toMatchObject({
      performedDateTime: '2026-11-20',
      code: { coding: [{ code: 'implant-impression-analog' }] },
    });
    expect(procedure).not.toHaveProperty('report');
    const [focal] = procedure.focalDevice as { manipulated: { reference: string } }[];
    const coping = resources.find((r) => `urn:uuid:${r.id}` === focal.manipulated.reference)!;
    expect(coping).toMatchObject({ resourceType: 'Device', status: 'inactive', modelNumber: 'SCN-43-ICE-C' });
    expect(coping.type).toMatchObject({ coding: [{ code: 'impression-coping' }] });
    expect((coping.type as { text: string }).text).toBe('Impression coping at site 36 (FDI), implant level');
    expect(resources.filter((r) => r.resourceType === 'DocumentReference')).toEqual([]);

    const text = await passportText(pid);
    expect(text).toContain('On 20 Nov 2026, an impression with impression copings on the implants, at site 36 (FDI)');
    expect(text).toContain(
      'Impression coping at site 36, used and removed: Impression coping, engaging, closed tray [SCN-43-ICE-C]',
    );
  });
});
