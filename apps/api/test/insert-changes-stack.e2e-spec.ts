// Issue 16 item 2: an insert change puts the new insert in the Stack. In a file of its own (its own
// database): it logs changes dated today at Beatrix's 33, which would move the review dates the
// shuffled tests of insert-changes.e2e-spec.ts compute from the seed.
import { addCalendarMonths } from '@torquetrail/domain';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RecallClock } from '../src/recalls/recall-clock.js';
import { larkspurId, parts } from './support/ledger-fixtures.js';
import { signInAll, siteId, startTestApp, type AccountKey, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
let part: (suffix: string) => string;
let beatrix33: string;
let today: string;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await signInAll(ctx);
  part = await parts(ctx.db, await larkspurId(ctx.db), 'Miravik HX 4.1');
  beatrix33 = await siteId(ctx.db, 'LL-1006', 33);
  today = ctx.app.get(RecallClock).today();
}, 90_000);
afterAll(() => ctx.close());

const get = (who: AccountKey, path: string) => ctx.http.get(path).set('Cookie', cookies[who]);
const log = (body: object) => ctx.http.post('/api/insert-changes').set('Cookie', cookies.dentist).send(body);
const change = (changedOn: string, oldPart: string, newPart: string) => ({
  siteId: beatrix33,
  changedOn,
  oldComponentId: part(oldPart),
  newComponentId: part(newPart),
  reason: 'wear',
});

// The Stack shows what is in the mouth: a logged change takes the insert in place out and puts the
// new one in, as any replaced part is recorded (removed_on on the old, replaces_id on the new).
describe('the Stack after an insert change', () => {
  type Part = { kind: string; componentId?: string; installedOn: string };
  const insertsAt = async (site: string) =>
    ((await get('dentist', `/api/sites/${site}`)).body.parts as Part[]).filter((p) => p.kind === 'retentive-insert');

  it('shows the insert of the latest change; history typed in later leaves it; a new change replaces it', async () => {
    const lastSeeded = addCalendarMonths(today, -5);
    // The seed logs Beatrix's changes as the app does: her strong inserts of five months ago are in place.
    expect(await insertsAt(beatrix33)).toEqual([
      expect.objectContaining({ componentId: part('RI-S'), installedOn: lastSeeded }),
    ]);
    const older = await log(change(addCalendarMonths(today, -7), 'RI-M', 'RI-S'));
    expect(older.status).toBe(201);
    expect(await insertsAt(beatrix33)).toEqual([
      expect.objectContaining({ componentId: part('RI-S'), installedOn: lastSeeded }),
    ]);

    const now = await log(change(today, 'RI-S', 'RI-M'));
    expect(now.status).toBe(201);
    expect(await insertsAt(beatrix33)).toEqual([
      expect.objectContaining({ componentId: part('RI-M'), installedOn: today }),
    ]);
    const { rows } = await ctx.db.execute<{ removed_on: string | null; replaced: boolean }>(
      sql`select ci.removed_on::text, exists (select 1 from component_instances n where n.replaces_id = ci.id) as replaced
          from component_instances ci join components c on c.id = ci.component_id
          where ci.site_id = ${beatrix33} and c.kind = 'retentive-insert' and ci.installed_on = ${lastSeeded}::date`,
    );
    expect(rows).toEqual([{ removed_on: today, replaced: true }]);
  });
});
