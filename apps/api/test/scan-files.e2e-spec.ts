// Scan files of a digital impression (issue 16, item 4) through the real app and the S3 fake:
// STL (ASCII and binary), PLY and OBJ typed by their bytes; a renamed image is a 415, a file over
// the cap a 413 (declared, or found mid-stream); the stored bytes come back unchanged; analog and
// amended impressions take none; the surgeon never reaches them.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { scanFiles } from '../src/db/schema/index.js';
import { asciiPly, asciiStl, binaryStl, objText } from './support/mesh-fixtures.js';
import { jpeg } from './support/radiograph-fixtures.js';
import { actorCookies } from './support/role-matrix.js';
import { scenarioTargets } from './support/scenario-targets.js';
import { type AccountKey, startTestApp, type TestContext } from './support/test-app.js';
import { replyBytes } from './support/reply-bytes.js';

const MAX = 4096;
let ctx: TestContext;
let cookies: Record<AccountKey, string>;
let t: Awaited<ReturnType<typeof scenarioTargets>>;
beforeAll(async () => {
  ctx = await startTestApp({ SCAN_FILE_MAX_BYTES: MAX });
  cookies = await actorCookies(ctx);
  t = await scenarioTargets(ctx, cookies);
});
afterAll(() => ctx.close());

const upload = (who: AccountKey, impression: string, data: Buffer, name = 'scan.stl') =>
  ctx.http
    .post(`/api/impressions/${impression}/scan-files?fileName=${encodeURIComponent(name)}`)
    .set('Cookie', cookies[who])
    .set('Content-Type', 'application/octet-stream')
    .send(data);

describe('scan files', () => {
  it('takes STL (ASCII and binary), PLY and OBJ by content, lists them and returns the same bytes', async () => {
    const impression = await t.fresh.impression();
    const files: [Buffer, string][] = [
      [asciiStl(2), 'stl'],
      [binaryStl(3), 'stl'],
      [asciiPly(4), 'ply'],
      [objText(5), 'obj'],
    ];
    for (const [data, type] of files) {
      // The name says nothing: every file is sent as "upper.bin".
      const res = await upload('dentist', impression, data, 'upper.bin');
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({ fileType: type, sizeBytes: data.length, originalName: 'upper.bin' });
      const back = await ctx.http
        .get(`/api/scan-files/${res.body.id}/file`)
        .set('Cookie', cookies.hygienist)
        .buffer(true)
        .parse(replyBytes);
      expect(back.status).toBe(200);
      expect(Buffer.compare(back.body as Buffer, data)).toBe(0);
    }
    const again = await upload('dentist', impression, objText(5));
    expect(again.status).toBe(409);
  });

  it('refuses a renamed image with a 415 in plain words, and stores nothing', async () => {
    const impression = await t.fresh.impression();
    const res = await upload('dentist', impression, await jpeg(8, 8, 3), 'lower.stl');
    expect(res.status).toBe(415);
    expect(res.body.message).toBe('The file is a JPEG image; send an STL, PLY or OBJ scan file');
    const cut = binaryStl(7).subarray(0, 120);
    const truncated = await upload('dentist', impression, cut);
    expect(truncated.status).toBe(415);
    expect(truncated.body.message).toMatch(
      /^The file is not a mesh we can read \(as a binary STL it would be 284 bytes, not 120\)/,
    );
  });

  it('refuses a file over the cap with a 413, declared or found mid-stream', async () => {
    const impression = await t.fresh.impression();
    const big = Buffer.concat([asciiStl(9), Buffer.from(' '.repeat(MAX))]);
    const declared = await upload('dentist', impression, big);
    expect(declared.status).toBe(413);
    expect(declared.body.message).toBe('The file is larger than the limit of 0 MB');
    // Chunked, without a length: the limit is found while the body streams.
    const req = ctx.http
      .post(`/api/impressions/${impression}/scan-files`)
      .set('Cookie', cookies.dentist)
      .set('Content-Type', 'application/octet-stream')
      .set('Transfer-Encoding', 'chunked');
    req.write(big.subarray(0, 2000));
    req.write(big.subarray(2000));
    const streamed = await req;
    expect(streamed.status).toBe(413);
    const rows = await ctx.db.select().from(scanFiles).where(eq(scanFiles.impressionId, impression));
    expect(rows).toEqual([]);
  });

  it('belongs to the current version of a digital impression only', async () => {
    const plan = await t.fresh.plan();
    const analog = await ctx.http
      .post(`/api/restorations/${plan}/impressions`)
      .set('Cookie', cookies.dentist)
      .send({ method: 'analog', takenOn: '2026-11-20' });
    const res = await upload('dentist', analog.body.id, asciiStl(11));
    expect(res.status).toBe(409);
    expect(res.body.message).toBe('Scan files belong to a digital impression; this one is analog');
    const digital = await t.fresh.impression();
    await ctx.http
      .post(`/api/impressions/${digital}/amendments`)
      .set('Cookie', cookies.dentist)
      .send({ takenOn: '2026-11-19', reason: 'Scanned the day before' });
    expect((await upload('dentist', digital, asciiStl(12))).status).toBe(409);
  });

  it('only the dentist uploads; the surgeon reaches neither the upload nor the file', async () => {
    const impression = await t.fresh.impression();
    const stored = await upload('dentist', impression, asciiStl(13));
    expect(stored.status).toBe(201);
    expect((await upload('hygienist', impression, asciiStl(14))).status).toBe(403);
    expect((await upload('surgeon', impression, asciiStl(14))).status).toBe(403);
    expect((await ctx.http.get(`/api/scan-files/${stored.body.id}/file`).set('Cookie', cookies.surgeon)).status).toBe(
      403,
    );
    expect(
      (await ctx.http.get(`/api/scan-files/${stored.body.id}/file`).set('Cookie', cookies.otherPracticeDentist)).status,
    ).toBe(404);
  });
});
