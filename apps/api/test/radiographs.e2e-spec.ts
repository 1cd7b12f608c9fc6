// Radiographs through the real app: uploads streamed through the AWS SDK to the S3 fake, type by
// bytes, DICOM written by dcmjs (an independent PS3.10 writer) and read back by the API's parser,
// previews checked pixel by pixel, refusals (413, 415, 422, 409, 503), entered-in-error and
// measurements with amendments.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { patientId, signIn, siteId, startTestApp, type TestContext } from './support/test-app.js';
import { dicomFile, greyAt, halvesPng, jpeg, waitForPreview } from './support/radiograph-fixtures.js';
import { replyBytes } from './support/reply-bytes.js';

let ctx: TestContext;
let dentist: string;
let hygienist: string;
let harold: string;
let site35: string;
let seq = 0;
beforeAll(async () => {
  ctx = await startTestApp();
  dentist = await signIn(ctx, 'dentist');
  hygienist = await signIn(ctx, 'hygienist');
  harold = await patientId(ctx.db, 'LL-1001');
  site35 = await siteId(ctx.db, 'LL-1001', 35);
});
afterAll(() => ctx.close());

const upload = (cookie: string, body: Buffer, query = '', patient = harold) =>
  ctx.http
    .post(`/api/patients/${patient}/radiographs${query}`)
    .set('Cookie', cookie)
    .set('Content-Type', 'application/octet-stream')
    .send(body);

const binary = (req: ReturnType<typeof ctx.http.get>) => req.buffer(true).parse(replyBytes);

const dicom16 = () =>
  dicomFile({
    rows: 40,
    columns: 60,
    bits: 16,
    photometric: 'MONOCHROME2',
    // columns 0–19: 0, 20–39: 1000, 40–59: 2000
    pixel: (_r, c) => (c < 20 ? 0 : c < 40 ? 1000 : 2000),
    window: { center: 1000, width: 1001 },
    pixelSpacing: [0.05, 0.04],
    imagerPixelSpacing: [0.055, 0.044],
    magnification: 1.1,
    studyDate: '20240315',
    seriesNumber: ++seq,
  });

describe('upload', () => {
  it('a PNG made in the test: stored, typed by its bytes, previewed and downloaded as an attachment', async () => {
    const png = await halvesPng(40, 20, 30, 220);
    const res = await upload(dentist, png, `?kind=periapical&takenOn=2025-02-01&siteIds=${site35}&fileName=scan.dcm`);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({
      fileType: 'png',
      kind: 'periapical',
      takenOn: '2025-02-01',
      rows: 20,
      columns: 40,
    });
    expect(res.body.originalName).toBe('scan.dcm');
    // the reply comes before the preview: a job makes it after the row commits
    expect(res.body).toMatchObject({ previewStatus: 'pending', previewProblem: null, previewAttempts: 0 });
    const early = await ctx.http.get(`/api/radiographs/${res.body.id}/preview`).set('Cookie', dentist);
    expect([409, 200]).toContain(early.status);
    expect(await waitForPreview(ctx.http, dentist, res.body.id)).toMatchObject({ previewStatus: 'ready' });
    expect(res.body.siteIds).toEqual([site35]);
    expect(res.body.sizeBytes).toBe(png.length);
    const original = await binary(ctx.http.get(`/api/radiographs/${res.body.id}/original`).set('Cookie', dentist));
    expect(original.status).toBe(200);
    expect(Buffer.compare(original.body as Buffer, png)).toBe(0);
    expect(original.headers['content-disposition']).toMatch(/^attachment; filename="radiograph-[0-9a-f-]+\.png"$/);
    expect(original.headers['x-content-type-options']).toBe('nosniff');
    expect(original.headers['cache-control']).toMatch(/no-store/);
    const preview = await binary(ctx.http.get(`/api/radiographs/${res.body.id}/preview`).set('Cookie', dentist));
    expect(preview.headers['content-type']).toBe('image/png');
    expect(await greyAt(preview.body as Buffer, 10, 5)).toBe(30);
    expect(await greyAt(preview.body as Buffer, 10, 35)).toBe(220);
    const thumb = await binary(ctx.http.get(`/api/radiographs/${res.body.id}/thumbnail`).set('Cookie', dentist));
    expect(thumb.status).toBe(200);
  });

  it('a JPEG made in the test', async () => {
    const res = await upload(hygienist, await jpeg(32, 16, 128));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ fileType: 'jpeg', kind: 'other', rows: 16, columns: 32 });
    expect(await waitForPreview(ctx.http, hygienist, res.body.id)).toMatchObject({ previewStatus: 'ready' });
    const thumb = await binary(ctx.http.get(`/api/radiographs/${res.body.id}/thumbnail`).set('Cookie', hygienist));
    expect(await greyAt(thumb.body as Buffer, 4, 4)).toBeGreaterThan(120);
  });

  it('DICOM 16-bit MONOCHROME2 by dcmjs: attributes read, window from the file applied (PS3.3 C.11.2.1.2)', async () => {
    const res = await upload(dentist, dicom16(), `?siteIds=${site35}`);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({
      fileType: 'dicom',
      rows: 40,
      columns: 60,
      pixelSpacing: [0.05, 0.04],
      imagerPixelSpacing: [0.055, 0.044],
      magnificationFactor: 1.1,
      studyDate: '2024-03-15',
      takenOn: '2024-03-15',
      modality: 'IO',
      bitsStored: 12,
      photometricInterpretation: 'MONOCHROME2',
      transferSyntaxUid: '1.2.840.10008.1.2.1',
      previewStatus: 'pending',
    });
    expect(await waitForPreview(ctx.http, dentist, res.body.id)).toMatchObject({ previewStatus: 'ready' });
    const preview = await binary(ctx.http.get(`/api/radiographs/${res.body.id}/preview`).set('Cookie', dentist));
    const png = preview.body as Buffer;
    // window 1000/1001: 0 → 0; 1000 → ((1000 − 999.5) ÷ 1000 + 0.5) × 255 = 127.6 → 128; 2000 → 255
    expect([await greyAt(png, 5, 10), await greyAt(png, 5, 30), await greyAt(png, 5, 50)]).toEqual([0, 128, 255]);
  });

  it('DICOM 8-bit MONOCHROME1 in Implicit VR Little Endian, no window: automatic window, inverted', async () => {
    const file = dicomFile({
      rows: 20,
      columns: 20,
      bits: 8,
      photometric: 'MONOCHROME1',
      pixel: (r) => (r < 10 ? 10 : 200),
      transferSyntax: '1.2.840.10008.1.2',
      seriesNumber: ++seq,
    });
    const res = await upload(dentist, file);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.transferSyntaxUid).toBe('1.2.840.10008.1.2');
    await waitForPreview(ctx.http, dentist, res.body.id);
    const preview = await binary(ctx.http.get(`/api/radiographs/${res.body.id}/preview`).set('Cookie', dentist));
    // the histogram's range 10…200 spans the whole grey scale; MONOCHROME1: low values are white
    expect(await greyAt(preview.body as Buffer, 2, 2)).toBe(255);
    expect(await greyAt(preview.body as Buffer, 15, 2)).toBe(0);
  });

  it('a DICOM file without its 128-byte preamble is still read', async () => {
    const res = await upload(dentist, dicom16().subarray(128));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.pixelSpacing).toEqual([0.05, 0.04]);
  });

  it('the same file twice for one patient → 409 naming the first', async () => {
    const file = dicom16();
    const first = await upload(dentist, file);
    expect(first.status).toBe(201);
    const again = await upload(hygienist, file);
    expect(again.status).toBe(409);
    expect(again.body.message).toContain(first.body.id);
  });

  it.each([
    ['an HTML page named .dcm', Buffer.from('<!DOCTYPE html><html><body>hi</body></html>'), /HTML page/],
    ['a PDF named .png', Buffer.from('%PDF-1.7\n%âãÏÓ\n1 0 obj'), /PDF document/],
  ])('%s → 415 with the detected type, nothing stored', async (_name, body, message) => {
    const res = await upload(dentist, body, '?fileName=x.dcm');
    expect(res.status).toBe(415);
    expect(res.body.message).toMatch(message);
  });

  it('a DICOM signature over unreadable content → 422 naming the reason', async () => {
    const bad = Buffer.concat([
      Buffer.alloc(128),
      Buffer.from('DICM'),
      Buffer.from([0x02, 0x00, 0x10, 0x00, 0x55, 0x49, 0xff, 0x7f]),
    ]);
    const res = await upload(dentist, bad);
    expect(res.status).toBe(422);
    expect(res.body.message).toMatch(/^The DICOM file cannot be read: /);
  });

  it('sites of another patient are refused (400 on siteIds)', async () => {
    const other = await siteId(ctx.db, 'LL-1005', 15);
    const res = await upload(dentist, await jpeg(8, 8, 10), `?siteIds=${other}`);
    expect(res.status).toBe(400);
    expect(res.body.fields).toHaveProperty('siteIds');
  });

  it('the other practice gets 404; a cross-site upload is refused 403; the practice admin 403', async () => {
    const other = await signIn(ctx, 'otherPracticeDentist');
    expect((await upload(other, await jpeg(8, 8, 11))).status).toBe(404);
    const cross = await ctx.http
      .post(`/api/patients/${harold}/radiographs`)
      .set('Cookie', dentist)
      .set('Origin', 'https://evil.example')
      .set('Content-Type', 'application/octet-stream')
      .send(await jpeg(8, 8, 12));
    expect(cross.status).toBe(403);
    const admin = await signIn(ctx, 'practice_admin');
    expect((await upload(admin, await jpeg(8, 8, 13))).status).toBe(403);
  });

  it('octet-stream bodies stay refused (415) on every other route', async () => {
    const res = await ctx.http
      .post('/api/torque-events')
      .set('Cookie', dentist)
      .set('Content-Type', 'application/octet-stream')
      .send(Buffer.from('{}'));
    expect(res.status).toBe(415);
  });
});

describe('entered in error and measurements', () => {
  it('hygienist measures, amends with a reason; entered-in-error hides the radiograph from the list', async () => {
    const up = await upload(hygienist, dicom16(), `?siteIds=${site35}&kind=periapical`);
    expect(up.status).toBe(201);
    const id = up.body.id as string;
    // 10 mm implant (placement record) over 200 px; contacts 30 and 20 px apical; spacing 0.05 × 0.04
    const points = {
      platform: [
        { row: 5, col: 20 },
        { row: 5, col: 40 },
      ],
      apex: { row: 205, col: 30 },
      mesial: { row: 35, col: 21 },
      distal: { row: 25, col: 39 },
    };
    const m = await ctx.http
      .post(`/api/radiographs/${id}/measurements`)
      .set('Cookie', hygienist)
      .send({ siteId: site35, points });
    expect(m.status, JSON.stringify(m.body)).toBe(201);
    expect(m.body.implantTrueMm).toBe(10);
    expect(m.body.mesialMm).toBeCloseTo(1.5, 9);
    expect(m.body.distalMm).toBeCloseTo(1.0, 9);
    // by Pixel Spacing the vertical implant is 200 × 0.05 = 10 mm: no disagreement
    expect(m.body.spacingEstimate).toMatchObject({ implantLengthMm: 10, flagged: false });
    const amended = await ctx.http
      .post(`/api/radiograph-measurements/${m.body.id}/amendments`)
      .set('Cookie', hygienist)
      .send({ points: { ...points, mesial: { row: 45, col: 21 } }, reason: 'Mesial contact re-marked' });
    expect(amended.status, JSON.stringify(amended.body)).toBe(201);
    // Only the points are named: the implant's true length is kept (amendments keep what they leave out).
    expect(amended.body).toMatchObject({
      supersedesId: m.body.id,
      amendmentReason: 'Mesial contact re-marked',
      implantTrueMm: 10,
      distalMm: m.body.distalMm,
    });
    expect(amended.body.mesialMm).toBeCloseTo(2.0, 9);
    const twice = await ctx.http
      .post(`/api/radiograph-measurements/${m.body.id}/amendments`)
      .set('Cookie', hygienist)
      .send({ points, reason: 'Again' });
    expect(twice.status).toBe(409);
    const detail = await ctx.http.get(`/api/radiographs/${id}`).set('Cookie', dentist);
    expect(detail.body.measurements.map((x: { id: string }) => x.id)).toEqual([amended.body.id]);

    const marked = await ctx.http
      .post(`/api/radiographs/${id}/entered-in-error`)
      .set('Cookie', dentist)
      .send({ reason: 'Filed to the wrong patient' });
    expect(marked.status, JSON.stringify(marked.body)).toBe(200);
    expect(marked.body.enteredInError.reason).toBe('Filed to the wrong patient');
    const list = await ctx.http.get(`/api/patients/${harold}/radiographs`).set('Cookie', dentist);
    expect(list.body.items.map((x: { id: string }) => x.id)).not.toContain(id);
    const all = await ctx.http
      .get(`/api/patients/${harold}/radiographs?includeEnteredInError=true`)
      .set('Cookie', dentist);
    expect(all.body.items.map((x: { id: string }) => x.id)).toContain(id);
    // the object stays in storage
    expect((await ctx.http.get(`/api/radiographs/${id}/original`).set('Cookie', dentist)).status).toBe(200);
  });
});
