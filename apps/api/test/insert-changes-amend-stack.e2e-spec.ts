// Issue 16 item 2: an amendment of an insert change moves the Stack too. Amending the new insert
// marks the insert the change fitted as entered in error (the row stays) and installs the right one
// from the same day; amending the day moves the removal of the old insert and the installation of
// the new one. The Stack and the Site file leave entered-in-error rows out; a second amendment of
// one version is refused (ADR 0004). In a file of its own: it logs changes dated today at
// Beatrix's 33, which would move the review dates the other insert-change files compute from the seed.
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
let beatrix43: string;
let today: string;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await signInAll(ctx);
  part = await parts(ctx.db, await larkspurId(ctx.db), 'Miravik HX 4.1');
  beatrix33 = await siteId(ctx.db, 'LL-1006', 33);
  // The tests run in a random order: the refusal reads 43, which the others leave alone.
  beatrix43 = await siteId(ctx.db, 'LL-1006', 43);
  today = ctx.app.get(RecallClock).today();
}, 90_000);
afterAll(() => ctx.close());

const get = (who: AccountKey, path: string) => ctx.http.get(path).set('Cookie', cookies[who]);
const post = (path: string, body: object) => ctx.http.post(path).set('Cookie', cookies.dentist).send(body);
const amend = (id: string, body: object) => post(`/api/insert-changes/${id}/amendments`, body);

type Part = { kind: string; componentId?: string; installedOn: string };
const insertsAt = async (site: string) =>
  ((await get('dentist', `/api/sites/${site}`)).body.parts as Part[])
    .filter((p) => p.kind === 'retentive-insert')
    .map((p) => ({ componentId: p.componentId, installedOn: p.installedOn }));

/** Every insert row ever fitted at the site, as stored (entered-in-error ones too), by install day. */
const insertRows = async (site: string) =>
  (
    await ctx.db.execute<{
      component_id: string;
      installed_on: string;
      removed_on: string | null;
      in_error: string | null;
      replaces_part: string | null;
    }>(
      sql`select ci.component_id, ci.installed_on::text, ci.removed_on::text, ci.entered_in_error_reason as in_error,
            r.component_id as replaces_part
          from component_instances ci join components c on c.id = ci.component_id
          left join component_instances r on r.id = ci.replaces_id
          where ci.site_id = ${site} and c.kind = 'retentive-insert'
          order by ci.installed_on, ci.recorded_at`,
    )
  ).rows;

describe('amending an insert change moves the Stack', () => {
  it('amending the part: the wrong insert entered in error, the right one in from the same day; then the day moves both', async () => {
    const lastSeeded = addCalendarMonths(today, -5);
    const made = await post('/api/insert-changes', {
      siteId: beatrix33,
      changedOn: today,
      oldComponentId: part('RI-S'),
      newComponentId: part('RI-L'),
      reason: 'wear',
    });
    expect(made.status).toBe(201);
    expect(await insertsAt(beatrix33)).toEqual([{ componentId: part('RI-L'), installedOn: today }]);

    const partFixed = await amend(made.body.id, {
      changedOn: today,
      newComponentId: part('RI-M'),
      reason: 'wear',
      amendmentReason: 'A medium insert was fitted, not a light one',
    });
    expect(partFixed.status).toBe(201);
    expect(await insertsAt(beatrix33)).toEqual([{ componentId: part('RI-M'), installedOn: today }]);

    const dayBefore = addCalendarMonths(today, -1);
    const dayFixed = await amend(partFixed.body.id, {
      changedOn: dayBefore,
      newComponentId: part('RI-M'),
      reason: 'wear',
      amendmentReason: 'Changed at last month’s visit, typed in today',
    });
    expect(dayFixed.status).toBe(201);
    expect(await insertsAt(beatrix33)).toEqual([{ componentId: part('RI-M'), installedOn: dayBefore }]);

    // Rows are never deleted: the strong insert of the seed now came out on the amended day, and the
    // two inserts the earlier versions fitted stay, entered in error with the amendment's reason.
    const rows = (await insertRows(beatrix33)).filter((r) => r.installed_on >= lastSeeded);
    expect(rows).toEqual([
      // (What it replaced is the older change's, which another test of this file may amend.)
      expect.objectContaining({
        component_id: part('RI-S'),
        installed_on: lastSeeded,
        removed_on: dayBefore,
        in_error: null,
      }),
      expect.objectContaining({
        component_id: part('RI-M'),
        installed_on: dayBefore,
        removed_on: null,
        in_error: null,
        replaces_part: part('RI-S'),
      }),
      expect.objectContaining({
        component_id: part('RI-L'),
        installed_on: today,
        in_error: 'A medium insert was fitted, not a light one',
      }),
      expect.objectContaining({
        component_id: part('RI-M'),
        installed_on: today,
        in_error: 'Changed at last month’s visit, typed in today',
      }),
    ]);

    // A second amendment of a version already amended is refused, and the Stack stays as it is.
    const again = await amend(made.body.id, {
      changedOn: today,
      newComponentId: part('RI-S'),
      reason: 'wear',
      amendmentReason: 'Second go at the first version',
    });
    expect(again.status).toBe(409);
    expect(await insertsAt(beatrix33)).toEqual([{ componentId: part('RI-M'), installedOn: dayBefore }]);
  });

  it('refuses a day before the insert the change replaced was fitted, and leaves the Stack as it was', async () => {
    const [latest] = (
      await ctx.db.execute<{ id: string; changed_on: string }>(
        sql`select ic.id, ic.changed_on::text from insert_changes ic
            where ic.site_id = ${beatrix43} and not exists (select 1 from insert_changes n where n.supersedes_id = ic.id)
            order by ic.changed_on desc, ic.recorded_at desc limit 1`,
      )
    ).rows;
    const before = await insertsAt(beatrix43);
    // The latest change (five months ago) took out the inserts of the change a year before it.
    expect(latest.changed_on).toBe(addCalendarMonths(today, -5));
    const res = await amend(latest.id, {
      changedOn: addCalendarMonths(today, -20),
      newComponentId: part('RI-S'),
      reason: 'wear',
      amendmentReason: 'Typed the wrong year',
    });
    expect(res.status).toBe(400);
    expect(res.body.fields).toEqual({ changedOn: 'Cannot be before the insert it replaced was fitted' });
    expect(await insertsAt(beatrix43)).toEqual(before);
  });

  it('amending the part of an older change fits the right insert between its day and the next change', async () => {
    // Beatrix's second-last seeded change at 33 fitted strong inserts that the last one (five months ago) took out.
    const lastSeeded = addCalendarMonths(today, -5);
    const older = addCalendarMonths(today, -17);
    const [change] = (
      await ctx.db.execute<{ id: string }>(
        sql`select id from insert_changes where site_id = ${beatrix33} and changed_on = ${older}::date`,
      )
    ).rows;
    const stackBefore = await insertsAt(beatrix33);
    const res = await amend(change.id, {
      changedOn: older,
      newComponentId: part('RI-M'),
      reason: 'wear',
      amendmentReason: 'The chart says medium inserts that year',
    });
    expect(res.status).toBe(201);
    // What is in the mouth today is untouched; the history between the two changes is corrected.
    expect(await insertsAt(beatrix33)).toEqual(stackBefore);
    const between = (await insertRows(beatrix33)).filter(
      (r) => r.installed_on === older || r.installed_on === lastSeeded,
    );
    expect(between).toEqual([
      expect.objectContaining({
        component_id: part('RI-S'),
        installed_on: older,
        removed_on: lastSeeded,
        in_error: 'The chart says medium inserts that year',
      }),
      expect.objectContaining({
        component_id: part('RI-M'),
        installed_on: older,
        removed_on: lastSeeded,
        in_error: null,
      }),
      // The next change now replaces the right insert.
      expect.objectContaining({
        component_id: part('RI-S'),
        installed_on: lastSeeded,
        in_error: null,
        replaces_part: part('RI-M'),
      }),
    ]);
  });
});
