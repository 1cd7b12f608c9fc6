// Radiograph upload limits and failures, each against an app of its own (its own settings, or an
// unreachable object store); each test reseeds the database, so they live apart from the main file.
import { describe, expect, it } from 'vitest';
import { dicomFile, jpeg } from './support/radiograph-fixtures.js';
import { patientId, signIn, startTestApp } from './support/test-app.js';

let seq = 0;
const dicom16 = () =>
  dicomFile({
    rows: 40,
    columns: 60,
    bits: 16,
    photometric: 'MONOCHROME2',
    pixel: (_r, c) => c * 10,
    seriesNumber: ++seq,
  });

describe('limits', () => {
  it('over the size limit → 413 before anything is stored; over the daily quota → 429', async () => {
    const small = await startTestApp({ RADIOGRAPH_MAX_BYTES: 6000, RADIOGRAPH_DAILY_QUOTA_BYTES: 9000 });
    try {
      const cookie = await signIn(small, 'dentist');
      const harold = await patientId(small.db, 'LL-1001');
      const send = (body: Buffer) =>
        small.http
          .post(`/api/patients/${harold}/radiographs`)
          .set('Cookie', cookie)
          .set('Content-Type', 'application/octet-stream')
          .send(body);
      // The demo seed's radiographs of Harold are there before and must be all that is there after.
      const ids = async () =>
        (
          (await small.http.get(`/api/patients/${harold}/radiographs`).set('Cookie', cookie)).body.items as {
            id: string;
          }[]
        ).map((r) => r.id);
      const before = await ids();
      const big = dicomFile({ rows: 60, columns: 60, bits: 16, photometric: 'MONOCHROME2', pixel: () => 7 });
      expect(big.length).toBeGreaterThan(6000);
      const refused = await send(big);
      expect(refused.status).toBe(413);
      expect(refused.body.message).toMatch(/larger than the limit/);
      expect(await ids()).toEqual(before);
      // 40 × 60 × 2 bytes of pixels: about 5 KB each; two of them cross 9000 bytes
      const first = dicom16();
      expect(first.length).toBeLessThan(6000);
      expect((await send(first)).status).toBe(201);
      const second = await send(dicom16());
      expect(second.status).toBe(429);
      expect(second.body.message).toMatch(/daily upload allowance/);
    } finally {
      await small.close();
    }
  });

  it('S3 unreachable → 503 and no row', async () => {
    const down = await startTestApp({ S3_ENDPOINT: 'http://127.0.0.1:9' });
    try {
      const cookie = await signIn(down, 'dentist');
      const harold = await patientId(down.db, 'LL-1001');
      const ids = async () =>
        (
          (await down.http.get(`/api/patients/${harold}/radiographs?includeEnteredInError=true`).set('Cookie', cookie))
            .body.items as { id: string }[]
        ).map((r) => r.id);
      const before = await ids();
      const res = await down.http
        .post(`/api/patients/${harold}/radiographs`)
        .set('Cookie', cookie)
        .set('Content-Type', 'application/octet-stream')
        .send(await jpeg(8, 8, 90));
      expect(res.status).toBe(503);
      expect(res.body.message).toMatch(/Object storage is unavailable/);
      expect(await ids()).toEqual(before);
    } finally {
      await down.close();
    }
  });
});
