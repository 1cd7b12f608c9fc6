// The preview of an upload is made by its own job at once, never left for the minute sweep, even
// behind a backlog of jobs with nothing left to do (previews of rows since gone, as every test
// file's reset leaves them, or of previews already made). The sweep runs every minute and the
// backlog took a minute at one job per polling interval, so the wait below is well under both.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { JobsService } from '../src/jobs/jobs.service.js';
import { RadiographPreviewService } from '../src/radiographs/radiograph-previews.service.js';
import { halvesPng, waitForPreview } from './support/radiograph-fixtures.js';
import { patientId, signIn, startTestApp, type TestContext } from './support/test-app.js';

/** Stale jobs queued ahead of the upload: at one job per polling interval (1 s) they took a minute. */
const BACKLOG = 60;
/** Well under the sweep's minute and the backlog's minute at one job per second. */
const WITHIN_MS = 25_000;

let ctx: TestContext;
let dentist: string;
let patient: string;
let width = 30;
beforeAll(async () => {
  ctx = await startTestApp();
  await ctx.app.get(JobsService).whenRunning(20_000);
  dentist = await signIn(ctx, 'dentist');
  patient = await patientId(ctx.db, 'LL-1004');
});
afterAll(() => ctx.close());

/** A small PNG of its own (a new width each time, so never a duplicate); the preview's wait in ms. */
async function uploadAndWait() {
  const png = await halvesPng(++width, 12, 40, 200);
  const res = await ctx.http
    .post(`/api/patients/${patient}/radiographs`)
    .set('Cookie', dentist)
    .set('Content-Type', 'application/octet-stream')
    .send(png);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  expect(res.body.previewStatus).toBe('pending');
  const started = Date.now();
  const done = await waitForPreview(ctx.http, dentist, res.body.id as string, WITHIN_MS);
  expect(done.previewStatus).toBe('ready');
  return Date.now() - started;
}

describe('the preview job of an upload', () => {
  it(`runs at once behind ${BACKLOG} queued jobs with nothing left to do`, async () => {
    const previews = ctx.app.get(RadiographPreviewService);
    for (let i = 0; i < BACKLOG; i++) await previews.queue(randomUUID());
    // Under the minute either wait would take; waitForPreview fails past WITHIN_MS.
    expect(await uploadAndWait()).toBeLessThan(WITHIN_MS);
  }, 60_000);
});
