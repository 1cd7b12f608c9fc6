// Planned sites and placements: the role matrix of the new routes, then recording Lucía Ferraz's
// planned 24 as the Northgate surgeon through the share, with the UDI parsed on the server.
// GS1 test data is built here: GTIN-14 check digit per GS1 General Specifications (mod-10,
// weights 3/1 from the right, computed with the domain's gtinCheckDigit); element strings per
// GS1 General Specifications (AI 01 GTIN, 17 expiry YYMMDD, 10 lot, 21 serial; FNC1 sent as GS
// 0x1D after a variable-length element that is not last; ]d2 = GS1 Data Matrix identifier).
import { GS, gtinCheckDigit } from '@torquetrail/domain';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { implantSites, placements, platforms, practices } from '../src/db/schema/index.js';
import { larkspurId, parts, platformId } from './support/ledger-fixtures.js';
import { actorCookies, all, describeRoleMatrix, type RoleCase } from './support/role-matrix.js';
import { type AccountKey, patientId, siteId, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
const ids: Record<string, string> = {};
let scn35: (suffix: string) => string;

const GTIN_BASE = '0884521234567';
const GTIN = GTIN_BASE + gtinCheckDigit(GTIN_BASE);
const BAD_GTIN = GTIN_BASE + ((gtinCheckDigit(GTIN_BASE) + 1) % 10);
const dayIso = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);
const YESTERDAY = dayIso(-1);

const placementBody = (over: Record<string, unknown> = {}) => ({
  platformId: ids.scn35,
  placedOn: YESTERDAY,
  lengthMm: 11.5,
  lot: null,
  udi: null,
  insertionTorqueNcm: 35,
  stabilityIsq: 72,
  grafting: 'Xenograft, buccal contour',
  loadingProtocol: 'conventional',
  axis: { x: 0.05, y: 0, z: 1 },
  closureComponentId: null,
  closureLot: null,
  notes: null,
  ...over,
});

/** Positions the scenario tests below use on Lucía Ferraz; the matrix leaves them free. */
const SCENARIO_POSITIONS = new Set([36, 46, 47]);
/** Free permanent positions of a patient, handed out one per call. */
async function freePositions(pid: string) {
  const taken = new Set(
    (await ctx.db.select({ fdi: implantSites.fdi }).from(implantSites).where(eq(implantSites.patientId, pid))).map(
      (s) => s.fdi,
    ),
  );
  const free = [1, 2, 3, 4]
    .flatMap((q) => [1, 2, 3, 4, 5, 6, 7, 8].map((t) => q * 10 + t))
    .filter((f) => !taken.has(f) && !SCENARIO_POSITIONS.has(f));
  return () => {
    const next = free.shift();
    if (next === undefined) throw new Error('no free position left');
    return next;
  };
}
let luciaFdi: () => number;
let okaforFdi: () => number;

/** A fresh planned site, added through the API as the dentist. */
async function freshSite(pid: string, fdi: number) {
  const res = await ctx.http.post(`/api/patients/${pid}/sites`).set('Cookie', cookies.dentist).send({ fdi });
  if (res.status !== 201) throw new Error(`fixture site failed: ${JSON.stringify(res.body)}`);
  return res.body.id as string;
}
/** A fresh site of Lucía Ferraz (shared with the surgeon) with a placement recorded on it. */
async function freshPlacement(by: AccountKey = 'dentist') {
  const site = await freshSite(ids.lucia, luciaFdi());
  const res = await ctx.http.post(`/api/sites/${site}/placements`).set('Cookie', cookies[by]).send(placementBody());
  if (res.status !== 201) throw new Error(`fixture placement failed: ${JSON.stringify(res.body)}`);
  return { siteId: site, id: res.body.id as string };
}

beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await actorCookies(ctx);
  const larkspur = await larkspurId(ctx.db);
  ids.lucia = await patientId(ctx.db, 'LL-1004');
  ids.okafor = await patientId(ctx.db, 'LL-1003');
  ids.harold = await patientId(ctx.db, 'LL-1001');
  ids.lucia24 = await siteId(ctx.db, 'LL-1004', 24);
  ids.scn35 = await platformId(ctx.db, larkspur, 'Solvra CN 3.5');
  scn35 = await parts(ctx.db, larkspur, 'Solvra CN 3.5');
  const [quarry] = await ctx.db
    .select({ id: practices.id })
    .from(practices)
    .where(eq(practices.name, 'Quarry Hill Dental'));
  ids.quarryPlatform = (
    await ctx.db.select({ id: platforms.id }).from(platforms).where(eq(platforms.practiceId, quarry.id))
  )[0].id;
  luciaFdi = await freePositions(ids.lucia);
  okaforFdi = await freePositions(ids.okafor);
  ids.okaforPlanned = await freshSite(ids.okafor, okaforFdi());
  // A planned site of the shared patient that no test places: the refusals below use it, so they
  // do not depend on whether the story of 24 has run.
  ids.luciaPlanned = await freshSite(ids.lucia, luciaFdi());
});
afterAll(() => ctx.close());

/** Placements: the dentist of the practice and the surgeon through a share; Quarry Hill sees nothing. */
const placementWrites = (ok: number) => all(403, { dentist: ok, surgeon: ok, otherPracticeDentist: 404 });
const notShared = (ok: number) => all(403, { dentist: ok, surgeon: 404, otherPracticeDentist: 404 });

const matrix: RoleCase[] = [
  // The surgeon may create sites in their own practice only (the guard lets them through): Larkspur's unshared patient is 404, a shared one 403.
  {
    route: 'POST /api/patients/:id/sites (not shared)',
    method: 'post',
    path: () => `/api/patients/${ids.okafor}/sites`,
    body: () => ({ fdi: okaforFdi() }),
    expect: notShared(201),
  },
  {
    route: 'POST /api/patients/:id/sites (shared)',
    method: 'post',
    path: () => `/api/patients/${ids.harold}/sites`,
    body: () => ({ fdi: 31 }),
    expect: all(403, { dentist: 201, otherPracticeDentist: 404 }),
  },
  {
    route: 'GET /api/sites/:id/placement-options (shared)',
    method: 'get',
    path: () => `/api/sites/${ids.lucia24}/placement-options`,
    expect: placementWrites(200),
  },
  {
    route: 'GET /api/sites/:id/placement-options (not shared)',
    method: 'get',
    path: () => `/api/sites/${ids.okaforPlanned}/placement-options`,
    expect: notShared(200),
  },
  {
    route: 'POST /api/sites/:id/placements (shared)',
    method: 'post',
    path: async () => `/api/sites/${await freshSite(ids.lucia, luciaFdi())}/placements`,
    body: placementBody,
    expect: placementWrites(201),
  },
  {
    route: 'POST /api/sites/:id/placements (not shared)',
    method: 'post',
    path: async () => `/api/sites/${await freshSite(ids.okafor, okaforFdi())}/placements`,
    body: placementBody,
    expect: notShared(201),
  },
  {
    route: 'POST /api/sites/:id/placements (no such site)',
    method: 'post',
    path: () => '/api/sites/00000000-0000-4000-8000-000000000000/placements',
    body: placementBody,
    expect: all(404, { hygienist: 403, practice_admin: 403 }),
  },
  {
    route: 'POST /api/placements/:id/amendments (shared)',
    method: 'post',
    path: async () => `/api/placements/${(await freshPlacement()).id}/amendments`,
    body: () => ({
      ...placementBody({ lengthMm: 13 }),
      closureComponentId: undefined,
      closureLot: undefined,
      amendmentReason: 'Length misread from the box',
    }),
    expect: placementWrites(201),
  },
];

describeRoleMatrix(() => ctx, matrix, { notFoundMessage: /^No such/ });

describe('adding a planned site', () => {
  it('adds a planned site at a free position, shown on the Arch', async () => {
    const res = await ctx.http
      .post(`/api/patients/${ids.lucia}/sites`)
      .set('Cookie', cookies.dentist)
      .send({ fdi: 36 });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ fdi: 36, status: 'planned', maintenanceStatus: 'not-examined', systemName: null });
    const arch = await ctx.http.get(`/api/patients/${ids.lucia}`).set('Cookie', cookies.dentist);
    expect(arch.body.sites.find((s: { fdi: number }) => s.fdi === 36)).toMatchObject({
      id: res.body.id,
      status: 'planned',
    });
  });

  it.each([19, 9, 0, 91, 55])(
    'refuses %s, which is not a permanent FDI position (ISO 3950), as 400 on fdi',
    async (fdi) => {
      const res = await ctx.http.post(`/api/patients/${ids.lucia}/sites`).set('Cookie', cookies.dentist).send({ fdi });
      expect(res.status).toBe(400);
      expect(res.body.fields.fdi).toBeTruthy();
    },
  );

  it('refuses a position that is not a number as 400 on fdi', async () => {
    const res = await ctx.http
      .post(`/api/patients/${ids.lucia}/sites`)
      .set('Cookie', cookies.dentist)
      .send({ fdi: '24' });
    expect(res.status).toBe(400);
    expect(res.body.fields.fdi).toBeTruthy();
  });

  it('answers 409 when the patient already has a live site there (planned 24, restored 14)', async () => {
    for (const fdi of [24, 14]) {
      const res = await ctx.http.post(`/api/patients/${ids.lucia}/sites`).set('Cookie', cookies.dentist).send({ fdi });
      expect(res.status).toBe(409);
    }
  });
});

describe('planning again where a site failed', () => {
  it('adds a planned site at a position whose earlier site failed; both stay in the record', async () => {
    const larkspur = await larkspurId(ctx.db);
    await ctx.db.insert(implantSites).values({ practiceId: larkspur, patientId: ids.lucia, fdi: 46, status: 'failed' });
    const res = await ctx.http
      .post(`/api/patients/${ids.lucia}/sites`)
      .set('Cookie', cookies.dentist)
      .send({ fdi: 46 });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const arch = await ctx.http.get(`/api/patients/${ids.lucia}`).set('Cookie', cookies.dentist);
    expect(
      arch.body.sites
        .filter((s: { fdi: number }) => s.fdi === 46)
        .map((s: { status: string }) => s.status)
        .sort(),
    ).toEqual(['failed', 'planned']);
    const again = await ctx.http
      .post(`/api/patients/${ids.lucia}/sites`)
      .set('Cookie', cookies.dentist)
      .send({ fdi: 46 });
    expect(again.status).toBe(409);
  });

  it('saves one of two simultaneous requests for the same position (the unique index), the other is 409', async () => {
    const send = () =>
      ctx.http.post(`/api/patients/${ids.lucia}/sites`).set('Cookie', cookies.dentist).send({ fdi: 47 });
    const statuses = (await Promise.all([send(), send()])).map((r) => r.status).sort((a, b) => a - b);
    expect(statuses).toEqual([201, 409]);
  });
});

async function expectNothingSaved(site: string) {
  const [row] = await ctx.db
    .select({ status: implantSites.status })
    .from(implantSites)
    .where(eq(implantSites.id, site));
  expect(row.status).toBe('planned');
  expect(await ctx.db.select({ id: placements.id }).from(placements).where(eq(placements.siteId, site))).toEqual([]);
}

describe('recording a placement of a planned site', () => {
  it("gives the surgeon the systems of the site's practice (Larkspur), which the catalogue route does not", async () => {
    const res = await ctx.http.get(`/api/sites/${ids.lucia24}/placement-options`).set('Cookie', cookies.surgeon);
    expect(res.status).toBe(200);
    expect(res.body.fdi).toBe(24);
    expect(res.body.caution).toMatch(/manufacturer-specific/);
    expect(res.body.systems.map((s: { name: string }) => s.name)).toEqual(['Miravik HX', 'Solvra CN', 'Tessely EX']);
    const solvra = res.body.systems.find((s: { name: string }) => s.name === 'Solvra CN');
    expect(solvra.platforms.map((p: { name: string }) => p.name)).toEqual([
      'Solvra CN 3.5',
      'Solvra CN 4.3',
      'Solvra CN 5.0',
    ]);
    expect(solvra.platforms[0].components.map((c: { kind: string }) => c.kind).sort()).toEqual([
      'cover-screw',
      'healing-abutment',
    ]);
    const own = await ctx.http.get('/api/catalogue').set('Cookie', cookies.surgeon);
    const ownPlatforms = own.body.systems.flatMap((s: { platforms: { id: string }[] }) => s.platforms.map((p) => p.id));
    expect(ownPlatforms).not.toContain(ids.scn35);
  });

  const bad: [string, () => Record<string, unknown>, string][] = [
    ['a GTIN with a wrong check digit', () => ({ udi: `(01)${BAD_GTIN}(17)281231(10)SCN3511-26X` }), 'udi'],
    ['a UDI that is not a GS1 element string', () => ({ udi: 'SCN3511-26X' }), 'udi'],
    [
      'a typed lot different from the UDI lot',
      () => ({ udi: `(01)${GTIN}(17)281231(10)SCN3511-26X`, lot: 'SCN3511-26Y' }),
      'lot',
    ],
    [
      'an expiry date before the placement date',
      () => ({ udi: `(01)${GTIN}(17)240131(10)SCN3511-22A`, placedOn: dayIso(-30) }),
      'udi',
    ],
    ['a platform of another practice', () => ({ platformId: ids.quarryPlatform }), 'platformId'],
    ['a placement date in the future', () => ({ placedOn: dayIso(3) }), 'placedOn'],
    ['a length outside 4–20 mm', () => ({ lengthMm: 3 }), 'lengthMm'],
    ['an insertion torque outside 5–100 N·cm', () => ({ insertionTorqueNcm: 120 }), 'insertionTorqueNcm'],
    ['an ISQ outside 1–99', () => ({ stabilityIsq: 0 }), 'stabilityIsq'],
    ['a zero axis vector', () => ({ axis: { x: 0, y: 0, z: 0 } }), 'axis'],
    ['a loading protocol that does not exist', () => ({ loadingProtocol: 'delayed' }), 'loadingProtocol'],
    ['a healing abutment of another platform', () => ({ closureComponentId: 'x' }), 'closureComponentId'],
  ];
  it.each(bad)('refuses %s with 400 on the field, and saves nothing', async (_what, over, field) => {
    const body: Record<string, unknown> = placementBody(over());
    if (body.closureComponentId === 'x')
      body.closureComponentId = ids.otherHealing ??= (await parts(ctx.db, await larkspurId(ctx.db), 'Solvra CN 4.3'))(
        'HA4',
      );
    const res = await ctx.http
      .post(`/api/sites/${ids.luciaPlanned}/placements`)
      .set('Cookie', cookies.surgeon)
      .send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.fields[field], JSON.stringify(res.body.fields)).toBeTruthy();
    await expectNothingSaved(ids.luciaPlanned);
  });

  it('names the check digit and the expiry in readable messages', async () => {
    const check = await ctx.http
      .post(`/api/sites/${ids.luciaPlanned}/placements`)
      .set('Cookie', cookies.surgeon)
      .send(placementBody({ udi: `(01)${BAD_GTIN}(10)A1` }));
    expect(check.body.fields.udi).toMatch(/check digit/);
    const expired = await ctx.http
      .post(`/api/sites/${ids.luciaPlanned}/placements`)
      .set('Cookie', cookies.surgeon)
      .send(placementBody({ udi: `(01)${GTIN}(17)240131(10)A1` }));
    expect(expired.body.fields.udi).toMatch(/expiry date 31 Jan 2024 .*is before the placement date/);
  });

  it('records 24 as the surgeon through the share: lot from the UDI, site placed, healing abutment in the Stack, in the Timeline', async () => {
    const udi = `(01)${GTIN}(17)281231(10)SCN3511-26X`;
    const res = await ctx.http
      .post(`/api/sites/${ids.lucia24}/placements`)
      .set('Cookie', cookies.surgeon)
      .send(placementBody({ udi, closureComponentId: scn35('HA4'), closureLot: 'HA4-2611-03' }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({
      siteId: ids.lucia24,
      platformName: 'Solvra CN 3.5',
      systemName: 'Solvra CN',
      lot: 'SCN3511-26X',
      udi,
      lengthMm: 11.5,
      supersedesId: null,
      axis: { x: 0.05, y: 0, z: 1 },
    });
    expect(res.body.surgeonName).toMatch(/Imbert.*Northgate/);
    expect(res.body.closureInstanceId).toBeTruthy();

    const file = await ctx.http.get(`/api/sites/${ids.lucia24}`).set('Cookie', cookies.surgeon);
    expect(file.body.status).toBe('placed');
    expect(file.body.placement).toMatchObject({
      platformName: 'Solvra CN 3.5',
      diameterMm: 3.5,
      lengthMm: 11.5,
      lot: 'SCN3511-26X',
      insertionTorqueNcm: 35,
      stabilityIsq: 72,
      loadingProtocol: 'conventional',
    });
    expect(file.body.parts).toEqual([
      expect.objectContaining({
        kind: 'healing-abutment',
        name: 'Healing abutment 4 mm',
        lot: 'HA4-2611-03',
        installedOn: YESTERDAY,
        torqueSpecNcm: null,
        lastTorque: null,
      }),
    ]);

    const timeline = await ctx.http.get(`/api/sites/${ids.lucia24}/timeline`).set('Cookie', cookies.dentist);
    const kinds = timeline.body.events.map((e: { kind: string; title: string }) => [e.kind, e.title]);
    expect(kinds).toContainEqual(['placement', 'Implant placed: Solvra CN, Solvra CN 3.5 × 11.5 mm']);
    expect(kinds).toContainEqual(['part', 'Installed: Healing abutment 4 mm']);

    const arch = await ctx.http.get(`/api/patients/${ids.lucia}`).set('Cookie', cookies.surgeon);
    expect(arch.body.sites.find((s: { fdi: number }) => s.fdi === 24)).toMatchObject({
      status: 'placed',
      systemName: 'Solvra CN',
    });
  });

  it('answers 409 for a second placement of a site that is no longer planned', async () => {
    const { siteId: placed } = await freshPlacement('surgeon');
    const res = await ctx.http
      .post(`/api/sites/${placed}/placements`)
      .set('Cookie', cookies.surgeon)
      .send(placementBody());
    expect(res.status).toBe(409);
    expect(
      await ctx.db.select({ id: placements.id }).from(placements).where(eq(placements.siteId, placed)),
    ).toHaveLength(1);
  });

  it('reads a raw scan (]d2, GS after the lot, serial last) and accepts the same typed lot', async () => {
    const site = await freshSite(ids.lucia, luciaFdi());
    // AI 01 GTIN, AI 17 expiry 281231, AI 10 lot (GS-terminated), AI 21 serial.
    const raw = `]d201${GTIN}1728123110SCN3511-26X${GS}21SN0042\r\n`;
    const res = await ctx.http
      .post(`/api/sites/${site}/placements`)
      .set('Cookie', cookies.surgeon)
      .send(placementBody({ udi: raw, lot: 'SCN3511-26X', closureComponentId: scn35('CS'), closureLot: 'CS-2611-01' }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ lot: 'SCN3511-26X', udi: raw });
    const [row] = await ctx.db
      .select({ udi: placements.udi, lot: placements.lot })
      .from(placements)
      .where(eq(placements.id, res.body.id));
    expect(row).toEqual({ udi: raw, lot: 'SCN3511-26X' });
  });

  it('refuses a raw scan with a wrong check digit as 400 on udi', async () => {
    const site = await freshSite(ids.lucia, luciaFdi());
    const res = await ctx.http
      .post(`/api/sites/${site}/placements`)
      .set('Cookie', cookies.surgeon)
      .send(placementBody({ udi: `]d201${BAD_GTIN}10LOT1${GS}21S1` }));
    expect(res.status).toBe(400);
    expect(res.body.fields.udi).toMatch(/check digit/);
    await expectNothingSaved(site);
  });
});

describe('amending a placement', () => {
  const amendment = (over: Record<string, unknown> = {}) => {
    const { closureComponentId: _c, closureLot: _l, ...rest } = placementBody({ lengthMm: 13, lot: 'SCN3513-26X' });
    return { ...rest, amendmentReason: 'Length and lot misread from the box', ...over };
  };

  // Each test amends a placement of its own, recorded by the surgeon on a fresh site.
  it('needs a reason', async () => {
    const { id } = await freshPlacement('surgeon');
    const res = await ctx.http
      .post(`/api/placements/${id}/amendments`)
      .set('Cookie', cookies.surgeon)
      .send(amendment({ amendmentReason: '' }));
    expect(res.status).toBe(400);
    expect(res.body.fields.amendmentReason).toBeTruthy();
  });

  it('checks the UDI of an amendment like a placement', async () => {
    const { id } = await freshPlacement('surgeon');
    const res = await ctx.http
      .post(`/api/placements/${id}/amendments`)
      .set('Cookie', cookies.surgeon)
      .send(amendment({ udi: `(01)${BAD_GTIN}(10)SCN3513-26X` }));
    expect(res.status).toBe(400);
    expect(res.body.fields.udi).toBeTruthy();
  });

  it('adds a new version; the old row is unchanged and stays visible, marked amended, in the Timeline', async () => {
    const { siteId: site, id: placement } = await freshPlacement('surgeon');
    const [before] = await ctx.db.select().from(placements).where(eq(placements.id, placement));
    const res = await ctx.http
      .post(`/api/placements/${placement}/amendments`)
      .set('Cookie', cookies.surgeon)
      .send(amendment());
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({
      supersedesId: placement,
      amendmentReason: 'Length and lot misread from the box',
      lengthMm: 13,
      lot: 'SCN3513-26X',
    });
    expect(res.body.surgeonName).toBe(before.surgeonName);
    const [after] = await ctx.db.select().from(placements).where(eq(placements.id, placement));
    expect(after).toEqual(before);

    const file = await ctx.http.get(`/api/sites/${site}`).set('Cookie', cookies.dentist);
    expect(file.body.placement).toMatchObject({ lengthMm: 13, lot: 'SCN3513-26X' });
    const timeline = await ctx.http.get(`/api/sites/${site}/timeline`).set('Cookie', cookies.dentist);
    const versions = timeline.body.events.filter((e: { kind: string }) => e.kind === 'placement');
    expect(versions.map((e: { id: string; amended: boolean }) => [e.id, e.amended])).toEqual(
      expect.arrayContaining([
        [placement, true],
        [res.body.id, false],
      ]),
    );
    expect(versions).toHaveLength(2);
  });

  it('answers 409 for a second amendment of the same old row', async () => {
    const { siteId: site, id: placement } = await freshPlacement('surgeon');
    const first = await ctx.http
      .post(`/api/placements/${placement}/amendments`)
      .set('Cookie', cookies.surgeon)
      .send(amendment());
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    const res = await ctx.http
      .post(`/api/placements/${placement}/amendments`)
      .set('Cookie', cookies.surgeon)
      .send(amendment({ lengthMm: 12 }));
    expect(res.status).toBe(409);
    const rows = await ctx.db
      .select({ id: placements.id })
      .from(placements)
      .where(and(eq(placements.siteId, site)));
    expect(rows).toHaveLength(2);
  });
});
