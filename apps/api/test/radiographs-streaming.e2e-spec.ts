// Radiographs against S3 through a recording proxy (support/s3-proxy.ts): the preview job
// recovering from a storage blip, giving up visibly after its retries, refusing images over the
// pixel limit; and the size limit under streaming — a chunked body (no Content-Length) that
// crosses it mid-upload, and a declared Content-Length over it refused before the body is read.
// Each test uses a patient of its own, so the proxy's faults and records never mix.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { ListMultipartUploadsCommand, ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dicomFile, greyAt, halvesPng, waitForPreview } from './support/radiograph-fixtures.js';
import { startS3Proxy, type S3Proxy } from './support/s3-proxy.js';
import { testS3Client } from './support/s3-client.js';
import { patientId, signIn, startTestApp, type TestContext } from './support/test-app.js';
import { replyBytes } from './support/reply-bytes.js';

const MAX_BYTES = 6 * 1024 * 1024;
let proxy: S3Proxy;
let ctx: TestContext;
let dentist: string;
let port: number;
let seq = 0;

beforeAll(async () => {
  proxy = await startS3Proxy();
  ctx = await startTestApp({
    S3_ENDPOINT: proxy.endpoint,
    RADIOGRAPH_MAX_BYTES: MAX_BYTES,
    RADIOGRAPH_PREVIEW_MAX_PIXELS: 5000,
    RADIOGRAPH_PREVIEW_RETRY_LIMIT: 2,
    RADIOGRAPH_PREVIEW_RETRY_DELAY_S: 1,
  });
  dentist = await signIn(ctx, 'dentist');
  const server = ctx.app.getHttpServer() as http.Server;
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  port = (server.address() as AddressInfo).port;
});
afterAll(async () => {
  await ctx.close();
  await proxy.close();
});

const small = () =>
  dicomFile({
    rows: 20,
    columns: 30,
    bits: 16,
    photometric: 'MONOCHROME2',
    pixel: (_r, c) => (c < 15 ? 0 : 2000),
    window: { center: 1000, width: 1001 },
    seriesNumber: ++seq,
  });

const upload = async (patient: string, body: Buffer) => {
  const res = await ctx.http
    .post(`/api/patients/${patient}/radiographs`)
    .set('Cookie', dentist)
    .set('Content-Type', 'application/octet-stream')
    .send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  expect(res.body.previewStatus).toBe('pending');
  return res.body.id as string;
};

const detail = async (id: string) => (await ctx.http.get(`/api/radiographs/${id}`).set('Cookie', dentist)).body;

/** The S3 requests that touched one patient's objects. */
const s3Calls = (patient: string) => proxy.requests.filter((r) => r.url.includes(`/${patient}/`));

describe('the preview job', () => {
  it('recovers after an S3 blip: the failed attempt is counted, the retry makes the preview', async () => {
    const patient = await patientId(ctx.db, 'LL-1001');
    proxy.failGets = (path) => path.includes(`/${patient}/`);
    try {
      const id = await upload(patient, small());
      const end = Date.now() + 20_000;
      while ((await detail(id)).previewAttempts < 1) {
        if (Date.now() > end) throw new Error('no failed attempt seen');
        await new Promise((r) => setTimeout(r, 100));
      }
      expect(await detail(id)).toMatchObject({ previewStatus: 'pending', previewProblem: null });
      proxy.failGets = () => false;
      const done = await waitForPreview(ctx.http, dentist, id);
      expect(done).toMatchObject({ previewStatus: 'ready', previewProblem: null });
      expect(done.previewAttempts).toBeGreaterThanOrEqual(1);
      const preview = await ctx.http
        .get(`/api/radiographs/${id}/preview`)
        .set('Cookie', dentist)
        .buffer(true)
        .parse(replyBytes);
      expect(preview.status).toBe(200);
      expect([await greyAt(preview.body as Buffer, 5, 2), await greyAt(preview.body as Buffer, 5, 25)]).toEqual([
        0, 255,
      ]);
    } finally {
      proxy.failGets = () => false;
    }
  });

  it('storage away through every retry → unavailable, saying why, each attempt counted', async () => {
    const patient = await patientId(ctx.db, 'LL-1003');
    proxy.failGets = (path) => path.includes(`/${patient}/`);
    try {
      const id = await upload(patient, small());
      const done = await waitForPreview(ctx.http, dentist, id);
      // RADIOGRAPH_PREVIEW_RETRY_LIMIT 2: the first attempt and two retries
      expect(done).toMatchObject({
        previewStatus: 'unavailable',
        previewAttempts: 3,
        previewProblem: 'preview not available: file storage could not be read after 3 attempts',
      });
      const preview = await ctx.http.get(`/api/radiographs/${id}/preview`).set('Cookie', dentist);
      expect(preview.status).toBe(422);
      expect(preview.body.message).toBe(done.previewProblem);
    } finally {
      proxy.failGets = () => false;
    }
  });

  it('an image over RADIOGRAPH_PREVIEW_MAX_PIXELS is kept and measured, its preview "image too large"', async () => {
    const patient = await patientId(ctx.db, 'LL-1005');
    const big = dicomFile({ rows: 60, columns: 100, bits: 8, photometric: 'MONOCHROME2', pixel: () => 50 });
    const dicomId = await upload(patient, big);
    const pngId = await upload(patient, await halvesPng(100, 60, 10, 200));
    expect(await waitForPreview(ctx.http, dentist, dicomId)).toMatchObject({
      previewStatus: 'unavailable',
      previewProblem: 'preview not available: image too large (100 × 60 pixels; the limit is 5000 pixels)',
    });
    expect(await waitForPreview(ctx.http, dentist, pngId)).toMatchObject({
      previewStatus: 'unavailable',
      previewProblem: 'preview not available: image too large (100 × 60 pixels; the limit is 5000 pixels)',
    });
  });
});

/** A raw request to the listening app, so the test decides the framing (chunked, or a bare Content-Length). */
function rawUpload(patient: string, headers: Record<string, string | number>) {
  return http.request({
    host: '127.0.0.1',
    port,
    method: 'POST',
    path: `/api/patients/${patient}/radiographs`,
    agent: false, // a socket of its own, so its byte count is this request's
    headers: { Cookie: dentist, 'Content-Type': 'application/octet-stream', Accept: 'application/json', ...headers },
  });
}

const replyOf = (req: http.ClientRequest) =>
  new Promise<{ status: number; body: { message?: string } }>((resolve, reject) => {
    req.on('response', (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () =>
        resolve({ status: res.statusCode ?? 0, body: JSON.parse(Buffer.concat(chunks).toString()) as object }),
      );
    });
    req.on('error', reject);
  });

/** Straight to the S3 fake (not through the proxy). */
async function withS3<T>(run: (s3: S3Client, bucket: string) => Promise<T>): Promise<T> {
  const { s3, bucket } = testS3Client();
  try {
    return await run(s3, bucket);
  } finally {
    s3.destroy();
  }
}

const objectsOf = (patient: string): Promise<string[]> =>
  withS3(async (s3, Bucket) => {
    const out = await s3.send(new ListObjectsV2Command({ Bucket, Prefix: 'radiographs/' }));
    return (out.Contents ?? []).map((o) => o.Key ?? '').filter((k) => k.includes(`/${patient}/`));
  });

/** Multipart uploads of a patient's objects still in progress on the fake (their parts on its disk). */
/** Waits (up to 10 s) until the fake has answered the patient's abort of a multipart upload. */
async function abortAnswered(patient: string): Promise<boolean> {
  const answered = () =>
    s3Calls(patient).some((c) => c.method === 'DELETE' && c.url.includes('uploadId=') && c.status !== undefined);
  for (let i = 0; i < 200 && !answered(); i++) await new Promise((r) => setTimeout(r, 50));
  return answered();
}

const uploadsInProgress = (patient: string): Promise<string[]> =>
  withS3(async (s3, Bucket) => {
    const out = await s3.send(new ListMultipartUploadsCommand({ Bucket, Prefix: 'radiographs/' }));
    return (out.Uploads ?? []).map((u) => u.Key ?? '').filter((k) => k.includes(`/${patient}/`));
  });

describe('the size limit under streaming', () => {
  it('a body over one part goes up as a multipart upload, completed, and reads back byte for byte', async () => {
    const patient = await patientId(ctx.db, 'LL-1005');
    // 1650 × 1650 × 2 bytes ≈ 5.4 MB: a 5 MB part and the rest, under the 6 MB limit
    const file = dicomFile({ rows: 1650, columns: 1650, bits: 16, photometric: 'MONOCHROME2', pixel: (r, c) => r + c });
    expect(file.length).toBeGreaterThan(5 * 1024 * 1024);
    const id = await upload(patient, file);
    const calls = proxy.requests
      .filter((r) => r.url.includes(`/${id}?`))
      .map(
        (c) =>
          `${c.method} ${c.url
            .replace(/^[^?]*\?/, '')
            .replace(/uploadId=[^&]+/, 'uploadId=…')
            .replace(/&x-id=\w+$/, '')}`,
      );
    expect(calls).toEqual([
      'POST uploads=', // CreateMultipartUpload
      'PUT partNumber=1&uploadId=…', // UploadPart
      'PUT partNumber=2&uploadId=…',
      'POST uploadId=…', // CompleteMultipartUpload
    ]);
    const original = await ctx.http
      .get(`/api/radiographs/${id}/original`)
      .set('Cookie', dentist)
      .buffer(true)
      .parse(replyBytes);
    expect(Buffer.compare(original.body as Buffer, file)).toBe(0);
  });

  it('a chunked body crossing the limit → 413 mid-stream: no row, no object, the multipart upload aborted', async () => {
    const patient = await patientId(ctx.db, 'LL-1002');
    // The demo seed gives the patient radiographs of their own: nothing may be added to them.
    const listed = async () =>
      (
        await ctx.http.get(`/api/patients/${patient}/radiographs?includeEnteredInError=true`).set('Cookie', dentist)
      ).body.items.map((r: { id: string }) => r.id);
    const rowsBefore = await listed();
    const objectsBefore = await objectsOf(patient);
    // 1900 × 1900 × 2 bytes ≈ 7.2 MB: the first 5 MB part reaches S3 before the limit (6 MB) is crossed
    const file = dicomFile({ rows: 1900, columns: 1900, bits: 16, photometric: 'MONOCHROME2', pixel: (r, c) => r ^ c });
    expect(file.length).toBeGreaterThan(MAX_BYTES);
    const req = rawUpload(patient, {});
    const reply = replyOf(req);
    for (let at = 0; at < file.length; at += 64 * 1024) {
      if (!req.write(file.subarray(at, at + 64 * 1024))) await new Promise((r) => req.once('drain', r));
    }
    req.end();
    const res = await reply;
    expect(req.getHeader('content-length')).toBeUndefined();
    expect(res.status).toBe(413);
    expect(res.body.message).toBe('The file is larger than the limit of 6 MB');

    expect(await listed()).toEqual(rowsBefore);
    expect(await objectsOf(patient)).toEqual(objectsBefore);
    const calls = s3Calls(patient).map((c) => `${c.method} ${c.url.replace(/^[^?]*/, '')}`);
    const uploadId = /uploadId=([^&]+)/.exec(calls.find((c) => c.startsWith('PUT ')) ?? '')?.[1];
    expect(uploadId, calls.join('\n')).toBeTruthy();
    expect(calls, calls.join('\n')).toContain(`DELETE ?uploadId=${uploadId}&x-id=AbortMultipartUpload`);
    // never completed, and its part is gone from the fake, as S3 removes an aborted upload's parts
    expect(calls.filter((c) => c.startsWith('POST ') && c.includes('uploadId='))).toEqual([]);
    expect(await abortAnswered(patient)).toBe(true);
    expect(await uploadsInProgress(patient)).toEqual([]);
  });

  it('an upload cancelled by the client after its first part → aborted: no row, no object, no parts left', async () => {
    const patient = await patientId(ctx.db, 'LL-1003');
    const listed = async () =>
      (
        await ctx.http.get(`/api/patients/${patient}/radiographs?includeEnteredInError=true`).set('Cookie', dentist)
      ).body.items.map((r: { id: string }) => r.id);
    const rowsBefore = await listed();
    const objectsBefore = await objectsOf(patient);
    // 1700 × 1700 × 2 bytes ≈ 5.8 MB: under the limit, over one part
    const file = dicomFile({
      rows: 1700,
      columns: 1700,
      bits: 16,
      photometric: 'MONOCHROME2',
      pixel: (r, c) => r + 3 * c,
    });
    const req = rawUpload(patient, { 'Content-Length': file.length });
    req.on('error', () => undefined); // the socket is destroyed below, mid-body
    // Past the first 5 MB part, then wait for that part to reach S3 before cancelling.
    const sent = 5.5 * 1024 * 1024;
    for (let at = 0; at < sent; at += 64 * 1024) {
      if (!req.write(file.subarray(at, Math.min(at + 64 * 1024, sent)))) await new Promise((r) => req.once('drain', r));
    }
    const partSent = () => s3Calls(patient).some((c) => c.method === 'PUT' && c.url.includes('partNumber=1'));
    for (let i = 0; i < 200 && !partSent(); i++) await new Promise((r) => setTimeout(r, 50));
    expect(partSent()).toBe(true);
    req.destroy();
    // Answered, not only sent: the abort was seen on its way in CI while the upload was still listed.
    expect(
      await abortAnswered(patient),
      s3Calls(patient)
        .map((c) => `${c.method} ${c.url}`)
        .join('\n'),
    ).toBe(true);
    expect(await uploadsInProgress(patient)).toEqual([]);
    expect(await listed()).toEqual(rowsBefore);
    expect(await objectsOf(patient)).toEqual(objectsBefore);
  });

  it('a declared Content-Length over the limit → 413 before a byte of the body is sent, S3 untouched', async () => {
    const patient = await patientId(ctx.db, 'LL-1004');
    const objectsBefore = await objectsOf(patient);
    const req = rawUpload(patient, { 'Content-Length': MAX_BYTES + 1 });
    const reply = replyOf(req);
    req.flushHeaders();
    try {
      const res = await reply;
      expect(res.status).toBe(413);
      expect(res.body.message).toBe('The file is larger than the limit of 6 MB');
      expect(req.socket?.bytesWritten ?? 0).toBeLessThan(2048); // the request line and headers only
    } finally {
      req.destroy();
    }
    expect(s3Calls(patient)).toEqual([]);
    expect(await objectsOf(patient)).toEqual(objectsBefore);
  });
});
