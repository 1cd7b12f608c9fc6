// A part entered in error (the insert an amended insert change fitted) was never in the mouth. Its
// row stays for the Timeline, but no other read takes it for a fitted part: the lot look-up does not
// trace it, the referral summary does not list it, and no torque or complication can be logged on it.
// The rule for every query is parts-in-place.ts (parts-in-place.spec.ts checks each one says which
// parts it reads). A file of its own: it logs a change dated today at Beatrix's 33, which would move
// the review dates other files compute from the seed.
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RecallClock } from '../src/recalls/recall-clock.js';
import { larkspurId, parts } from './support/ledger-fixtures.js';
import { patientId, signInAll, siteId, startTestApp, type AccountKey, type TestContext } from './support/test-app.js';
import { replyBytes } from './support/reply-bytes.js';
import { pdfText } from './support/pdf-text.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
let part: (suffix: string) => string;
let beatrix: string;
let beatrix33: string;
let today: string;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await signInAll(ctx);
  part = await parts(ctx.db, await larkspurId(ctx.db), 'Miravik HX 4.1');
  beatrix = await patientId(ctx.db, 'LL-1006');
  beatrix33 = await siteId(ctx.db, 'LL-1006', 33);
  today = ctx.app.get(RecallClock).today();
}, 90_000);
afterAll(() => ctx.close());

const get = (path: string) => ctx.http.get(path).set('Cookie', cookies.dentist);
const post = (path: string, body: object) => ctx.http.post(path).set('Cookie', cookies.dentist).send(body);

const catalogue = async (componentId: string) =>
  (
    await ctx.db.execute<{ name: string; reference_code: string }>(
      sql`select name, reference_code from components where id = ${componentId}`,
    )
  ).rows[0];

const referralSummaryText = async () => {
  const res = await get(`/api/patients/${beatrix}/referral-summary/pdf`).buffer(true).parse(replyBytes);
  expect(res.status).toBe(200);
  return pdfText(res.body as Buffer);
};

describe('a part entered in error is nowhere taken for a fitted part', () => {
  it('the lot look-up, the referral summary, torque and complications leave it out', async () => {
    // The light insert is logged, then amended to the medium one: the light insert's row is entered in error.
    const made = await post('/api/insert-changes', {
      siteId: beatrix33,
      changedOn: today,
      oldComponentId: part('RI-S'),
      newComponentId: part('RI-L'),
      reason: 'wear',
    });
    expect(made.status).toBe(201);
    const amended = await post(`/api/insert-changes/${made.body.id}/amendments`, {
      changedOn: today,
      newComponentId: part('RI-M'),
      reason: 'wear',
      amendmentReason: 'A medium insert was fitted, not a light one',
    });
    expect(amended.status).toBe(201);
    const [inError] = (
      await ctx.db.execute<{ id: string }>(
        sql`select id from component_instances
             where site_id = ${beatrix33} and component_id = ${part('RI-L')} and entered_in_error_at is not null`,
      )
    ).rows;
    expect(inError).toBeDefined();
    const light = await catalogue(part('RI-L'));
    const medium = await catalogue(part('RI-M'));

    // Lot look-up by the catalogue part: the medium insert of today is traced, the light one is not.
    const traced = async (referenceCode: string) =>
      (
        (await get(`/api/lot-lookup?by=part&q=${encodeURIComponent(referenceCode)}`)).body.rows as {
          siteId: string;
          installedOn: string;
        }[]
      ).filter((r) => r.siteId === beatrix33 && r.installedOn === today);
    expect(await traced(medium.reference_code)).toHaveLength(1);
    expect(await traced(light.reference_code)).toEqual([]);

    // The referral summary lists the insert in place, not the one entered in error.
    const text = await referralSummaryText();
    expect(text).toContain(medium.name);
    expect(text).not.toContain(light.name);

    // Nothing can be logged on a part that was never fitted; the reply says why, beside the field.
    const complication = await post('/api/complications', {
      siteId: beatrix33,
      componentInstanceId: inError.id,
      kind: 'other',
      occurredOn: today,
    });
    expect(complication.status).toBe(400);
    expect(complication.body.fields.componentInstanceId).toBe(
      'This part was entered in error: choose the part that was fitted',
    );
    const torque = await post('/api/torque-events', {
      componentInstanceId: inError.id,
      appliedNcm: 15,
      reason: 'initial-seating',
    });
    expect(torque.status).toBe(409);
    expect(torque.body.message).toMatch(/entered in error/);
  });
});
