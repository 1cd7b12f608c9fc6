// Traceable parts (issue 15 §5): what the surgeon recorded at placement (GTIN, serial, expiry,
// grafting, notes) is in the Site file and the Timeline; the catalogue learns which system a GTIN
// belongs to from the first placement that carries it, and a later placement whose UDI's GTIN
// belongs to another system than the one chosen is flagged. GS1 data built as in
// placements.e2e-spec.ts (check digit from the domain; AIs 01, 17, 10, 21 in human-readable form).
import { gtinCheckDigit } from '@torquetrail/domain';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SiteFile, TimelineReply } from '@torquetrail/contracts';
import { signIn, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let dentist: string;
let admin: string;
beforeAll(async () => {
  ctx = await startTestApp();
  dentist = await signIn(ctx, 'dentist');
  admin = await signIn(ctx, 'practice_admin');
});
afterAll(() => ctx.close());

const GTIN_BASE = '0761234598765';
const GTIN = GTIN_BASE + gtinCheckDigit(GTIN_BASE);
const UDI = `(01)${GTIN}(17)291130(10)TRC-5521(21)SN00417`;
const YESTERDAY = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);

async function plannedSites(...fdis: number[]) {
  const patient = await ctx.http
    .post('/api/patients')
    .set('Cookie', dentist)
    .send({ givenName: 'Tamsin', familyName: 'Traceford', birthDate: '1958-02-17' });
  expect(patient.status).toBe(201);
  const sites: string[] = [];
  for (const fdi of fdis)
    sites.push(
      (await ctx.http.post(`/api/patients/${patient.body.id}/sites`).set('Cookie', dentist).send({ fdi })).body.id,
    );
  return sites;
}

const place = (siteId: string, platformId: string) =>
  ctx.http.post(`/api/sites/${siteId}/placements`).set('Cookie', dentist).send({
    platformId,
    placedOn: YESTERDAY,
    lengthMm: 10,
    lot: 'TRC-5521',
    udi: UDI,
    insertionTorqueNcm: 40,
    stabilityIsq: 70,
    grafting: 'Autogenous chips, buccal wall',
    loadingProtocol: 'conventional',
    axis: null,
    closureComponentId: null,
    closureLot: null,
    notes: 'Thin buccal plate; primary stability good',
  });

describe('what the surgeon recorded at placement', () => {
  it('is in the Site file and the Timeline; a GTIN of another system is flagged in both', async () => {
    const [first, second] = await plannedSites(14, 24);
    const options = await ctx.http.get(`/api/sites/${first}/placement-options`).set('Cookie', dentist);
    const systems = options.body.systems as { name: string; platforms: { id: string }[] }[];
    expect(systems.length).toBeGreaterThanOrEqual(2);
    const [a, b] = systems;

    expect((await place(first, a.platforms[0].id)).status).toBe(201);
    const file = (await ctx.http.get(`/api/sites/${first}`).set('Cookie', dentist)).body as SiteFile;
    expect(file.placement).toMatchObject({
      udi: UDI,
      gtin: GTIN,
      serial: 'SN00417',
      expiry: '2029-11-30',
      grafting: 'Autogenous chips, buccal wall',
      notes: 'Thin buccal plate; primary stability good',
      systemName: a.name,
      // The first placement of the GTIN teaches the catalogue: nothing to flag.
      gtinOtherSystem: null,
    });
    const timeline = (await ctx.http.get(`/api/sites/${first}/timeline`).set('Cookie', dentist)).body as TimelineReply;
    const placed = timeline.events.find((e) => e.kind === 'placement')!;
    for (const words of [
      `GTIN ${GTIN}`,
      'serial SN00417',
      // In the practice's date order (day-month-year, Larkspur's): issue 15 §7.
      'expiry 30 Nov 2029',
      'grafting: Autogenous chips, buccal wall',
      'notes: Thin buccal plate; primary stability good',
    ])
      expect(placed.detail).toContain(words);
    expect(placed.detail).not.toContain('catalogue knows');

    // The same label recorded with an implant of another system: flagged, with the known system named.
    expect((await place(second, b.platforms[0].id)).status).toBe(201);
    const flagged = (await ctx.http.get(`/api/sites/${second}`).set('Cookie', dentist)).body as SiteFile;
    expect(flagged.placement).toMatchObject({ systemName: b.name, gtinOtherSystem: a.name });
    const flaggedTimeline = (await ctx.http.get(`/api/sites/${second}/timeline`).set('Cookie', dentist))
      .body as TimelineReply;
    expect(flaggedTimeline.events.find((e) => e.kind === 'placement')!.detail).toContain(
      `the catalogue knows this GTIN as ${a.name}, not the system chosen`,
    );
  });

  it('the administrator enters a GTIN for a system: the catalogue lists it and the flag follows', async () => {
    const base = '0761234598772';
    const gtin = base + gtinCheckDigit(base);
    const udi = `(01)${gtin}(10)ENT-1`;
    const [site] = await plannedSites(15);
    const options = await ctx.http.get(`/api/sites/${site}/placement-options`).set('Cookie', dentist);
    const [a, b] = options.body.systems as { id: string; name: string; platforms: { id: string }[] }[];
    const placed = await ctx.http.post(`/api/sites/${site}/placements`).set('Cookie', dentist).send({
      platformId: a.platforms[0].id,
      placedOn: YESTERDAY,
      lengthMm: 10,
      lot: 'ENT-1',
      udi,
      insertionTorqueNcm: 35,
      stabilityIsq: null,
      grafting: null,
      loadingProtocol: null,
      axis: null,
      closureComponentId: null,
      closureLot: null,
      notes: null,
    });
    expect(placed.status).toBe(201);
    const learned = (await ctx.http.get('/api/catalogue').set('Cookie', admin)).body.systems.find(
      (s: { id: string }) => s.id === a.id,
    );
    expect(learned.gtins).toContainEqual({ gtin, entered: false });

    // The label was of system b all along: the administrator says so (a GTIN-13 is kept as GTIN-14).
    const entered = await ctx.http
      .patch(`/api/catalogue/systems/${b.id}`)
      .set('Cookie', admin)
      .send({ gtins: [gtin.slice(1)] });
    expect(entered.status).toBe(200);
    expect(entered.body.gtins).toContainEqual({ gtin, entered: true });
    const file = (await ctx.http.get(`/api/sites/${site}`).set('Cookie', dentist)).body as SiteFile;
    expect(file.placement?.gtinOtherSystem).toBe(b.name);

    const bad = await ctx.http
      .patch(`/api/catalogue/systems/${b.id}`)
      .set('Cookie', admin)
      .send({ gtins: [`${base}${(gtinCheckDigit(base) + 1) % 10}`] });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body.fields)).toMatch(/last digit checks/);
    const dentistTry = await ctx.http
      .patch(`/api/catalogue/systems/${b.id}`)
      .set('Cookie', dentist)
      .send({ gtins: [gtin] });
    expect(dentistTry.status).toBe(403);
  });
});
