// Every ledger route for each role of Larkspur Lane, the Northgate surgeon (shared into LL-1001,
// LL-1002, LL-1004, LL-1005), a dentist of the unrelated Quarry Hill practice and an anonymous
// caller. Expectations follow docs/authorization.md. Routes that change data get a fresh target
// for every call, so each expectation is independent of the order the roles run in.
import { and, eq } from 'drizzle-orm';
import type { Response } from 'supertest';
import { afterAll, beforeAll, expect } from 'vitest';
import {
  componentInstances,
  components,
  implantSystems,
  platforms,
  practices,
  torqueWrenches,
} from '../src/db/schema/index.js';
import { larkspurId, parts } from './support/ledger-fixtures.js';
import {
  actorCookies,
  all,
  describeRoleMatrix,
  otherPracticeRead,
  type RoleCase,
  sharedRead,
  unsharedRead,
} from './support/role-matrix.js';
import { type AccountKey, patientId, siteId, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
const ids: Record<string, string> = {};
let tex: (suffix: string) => string;

const wendellPlan = () => ({
  patientId: ids.wendell,
  kind: 'splinted-bridge',
  retention: 'screw-to-implant',
  material: 'zirconia',
  copingsSplinted: true,
  labName: 'Ferncliff Dental Lab',
  labEmail: 'orders@ferncliff-lab.example',
  sites: [ids.wendell15, ids.wendell16].map((s) => ({
    siteId: s,
    interface: 'non-engaging',
    impressionCoping: 'non-engaging',
    screwComponentIds: [tex('PSI')],
    impressionCopingComponentId: tex('ICN-O'),
  })),
});

/** A fresh planned restoration (made through the API as the dentist). */
async function freshPlan() {
  const res = await ctx.http.post('/api/restorations').set('Cookie', cookies.dentist).send(wendellPlan());
  if (res.status !== 201) throw new Error(`fixture plan failed: ${JSON.stringify(res.body)}`);
  return res.body.id as string;
}
async function freshTorque() {
  const res = await ctx.http.post('/api/torque-events').set('Cookie', cookies.dentist).send({
    componentInstanceId: ids.haroldScrew,
    appliedNcm: 25,
    reason: 're-torque-at-recall',
    performedAt: '2025-01-10T10:00:00Z',
  });
  if (res.status !== 201) throw new Error(`fixture torque failed: ${JSON.stringify(res.body)}`);
  return res.body.id as string;
}
async function freshComplication() {
  const res = await ctx.http
    .post('/api/complications')
    .set('Cookie', cookies.dentist)
    .send({ siteId: ids.harold35, kind: 'other', occurredOn: '2024-02-02' });
  if (res.status !== 201) throw new Error(`fixture complication failed: ${JSON.stringify(res.body)}`);
  return res.body.id as string;
}

beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await actorCookies(ctx);
  const larkspur = await larkspurId(ctx.db);
  const [quarry] = await ctx.db
    .select({ id: practices.id })
    .from(practices)
    .where(eq(practices.name, 'Quarry Hill Dental'));
  tex = await parts(ctx.db, larkspur, 'Tessely EX 4.1');
  ids.harold = await patientId(ctx.db, 'LL-1001');
  ids.okafor = await patientId(ctx.db, 'LL-1003');
  ids.wendell = await patientId(ctx.db, 'LL-1005');
  ids.quarryPatient = await patientId(ctx.db, 'QH-2001');
  ids.harold35 = await siteId(ctx.db, 'LL-1001', 35);
  ids.okafor46 = await siteId(ctx.db, 'LL-1003', 46);
  ids.quarry36 = await siteId(ctx.db, 'QH-2001', 36);
  ids.wendell15 = await siteId(ctx.db, 'LL-1005', 15);
  ids.wendell16 = await siteId(ctx.db, 'LL-1005', 16);
  const [screw] = await ctx.db
    .select({ id: componentInstances.id })
    .from(componentInstances)
    .where(eq(componentInstances.siteId, ids.harold35));
  ids.haroldScrew = screw.id;
  const [okaforScrew] = await ctx.db
    .select({ id: componentInstances.id })
    .from(componentInstances)
    .innerJoin(components, eq(components.id, componentInstances.componentId))
    .where(and(eq(componentInstances.siteId, ids.okafor46), eq(components.kind, 'abutment-screw')));
  ids.okaforScrew = okaforScrew.id;
  const sys = async (practiceId: string) =>
    (
      await ctx.db
        .select({ id: implantSystems.id })
        .from(implantSystems)
        .where(eq(implantSystems.practiceId, practiceId))
    )[0].id;
  ids.system = await sys(larkspur);
  ids.quarrySystem = await sys(quarry.id);
  ids.platform = (
    await ctx.db.select({ id: platforms.id }).from(platforms).where(eq(platforms.systemId, ids.system))
  )[0].id;
  ids.component = (
    await ctx.db.select({ id: components.id }).from(components).where(eq(components.platformId, ids.platform))
  )[0].id;
  ids.quarryComponent = (
    await ctx.db.select({ id: components.id }).from(components).where(eq(components.practiceId, quarry.id))
  )[0].id;
  ids.wrench = (
    await ctx.db.select({ id: torqueWrenches.id }).from(torqueWrenches).where(eq(torqueWrenches.practiceId, larkspur))
  )[0].id;
  ids.quarryWrench = (
    await ctx.db.select({ id: torqueWrenches.id }).from(torqueWrenches).where(eq(torqueWrenches.practiceId, quarry.id))
  )[0].id;
  ids.haroldBridge = (
    await ctx.http.get(`/api/patients/${ids.harold}/restorations`).set('Cookie', cookies.dentist)
  ).body.items[0].id;
  ids.okaforCrown = (
    await ctx.http.get(`/api/patients/${ids.okafor}/restorations`).set('Cookie', cookies.dentist)
  ).body.items[0].id;
  const lab = await ctx.http
    .post(`/api/restorations/${ids.haroldBridge}/lab-prescriptions`)
    .set('Cookie', cookies.dentist)
    .send({});
  ids.labPrescription = lab.body.id;
  const okaforLab = await ctx.http
    .post(`/api/restorations/${ids.okaforCrown}/lab-prescriptions`)
    .set('Cookie', cookies.dentist)
    .send({});
  ids.okaforLab = okaforLab.body.id;
});
afterAll(() => ctx.close());

/** Clinical writes: the dentist only; another practice's record is 404 (the guard lets a dentist through). */
const dentistWrites = (ok: number) => all(403, { dentist: ok, otherPracticeDentist: 404 });
/** Catalogue and wrench writes: the practice admin only (the guard refuses every other role). */
const adminWrites = (ok: number) => all(403, { practice_admin: ok });
/** A lab prescription is served as a PDF. */
const pdf = (res: Response) => {
  if (res.status === 200) expect(res.headers['content-type']).toBe('application/pdf');
};

const matrix: RoleCase[] = [
  { route: 'GET /api/catalogue', method: 'get', path: () => '/api/catalogue', expect: all(200) },
  {
    route: 'POST /api/catalogue/systems',
    method: 'post',
    path: () => '/api/catalogue/systems',
    body: () => ({ name: 'Ostrava TX', manufacturer: 'Ostrava Implants' }),
    expect: adminWrites(201),
  },
  {
    route: 'PATCH /api/catalogue/systems/:id',
    method: 'patch',
    path: () => `/api/catalogue/systems/${ids.system}`,
    body: () => ({ manufacturer: 'Solvra Dental AG' }),
    expect: adminWrites(200),
  },
  {
    route: 'PATCH /api/catalogue/systems/:id (another practice)',
    method: 'patch',
    path: () => `/api/catalogue/systems/${ids.quarrySystem}`,
    body: () => ({ name: 'x' }),
    expect: adminWrites(404),
  },
  {
    route: 'POST /api/catalogue/platforms',
    method: 'post',
    path: () => '/api/catalogue/platforms',
    body: () => ({
      systemId: ids.system,
      name: 'Solvra CN 6.0',
      diameterMm: 6,
      connection: 'internal-conical',
      platformShift: true,
    }),
    expect: adminWrites(201),
  },
  {
    route: 'PATCH /api/catalogue/platforms/:id',
    method: 'patch',
    path: () => `/api/catalogue/platforms/${ids.platform}`,
    body: () => ({ platformShift: true }),
    expect: adminWrites(200),
  },
  {
    route: 'POST /api/catalogue/components',
    method: 'post',
    path: () => '/api/catalogue/components',
    body: () => ({
      platformId: ids.platform,
      kind: 'abutment-screw',
      name: 'Abutment screw, gold',
      referenceCode: 'SCN-35-ASG',
      torqueSpecNcm: 25,
      tolerancePct: 6,
    }),
    expect: adminWrites(201),
  },
  {
    route: 'PATCH /api/catalogue/components/:id',
    method: 'patch',
    path: () => `/api/catalogue/components/${ids.component}`,
    body: () => ({ tolerancePct: 8 }),
    expect: adminWrites(200),
  },
  { route: 'GET /api/wrenches', method: 'get', path: () => '/api/wrenches', expect: all(200, { surgeon: 403 }) },
  {
    route: 'POST /api/wrenches',
    method: 'post',
    path: () => '/api/wrenches',
    body: () => ({ label: 'Spring wrench C', type: 'spring', lastCalibratedOn: '2026-11-01' }),
    expect: adminWrites(201),
  },
  {
    route: 'PATCH /api/wrenches/:id',
    method: 'patch',
    path: () => `/api/wrenches/${ids.wrench}`,
    body: () => ({ label: 'Spring wrench A (surgery 1, serviced)' }),
    expect: adminWrites(200),
  },
  {
    route: 'PATCH /api/wrenches/:id (another practice)',
    method: 'patch',
    path: () => `/api/wrenches/${ids.quarryWrench}`,
    body: () => ({ label: 'x' }),
    expect: adminWrites(404),
  },
  {
    route: 'GET /api/wrenches/:id/calibrations',
    method: 'get',
    path: () => `/api/wrenches/${ids.wrench}/calibrations`,
    expect: all(200, { surgeon: 403, otherPracticeDentist: 404 }),
  },
  {
    route: 'GET /api/wrenches/:id/calibrations (another practice)',
    method: 'get',
    path: () => `/api/wrenches/${ids.quarryWrench}/calibrations`,
    expect: all(404, { surgeon: 403, otherPracticeDentist: 200 }),
  },
  {
    route: 'POST /api/wrenches/:id/calibrations',
    method: 'post',
    path: () => `/api/wrenches/${ids.wrench}/calibrations`,
    body: () => ({ calibratedOn: '2026-11-30', note: 'Bench check' }),
    expect: adminWrites(201),
  },
  {
    route: 'POST /api/wrenches/:id/calibrations (another practice)',
    method: 'post',
    path: () => `/api/wrenches/${ids.quarryWrench}/calibrations`,
    body: () => ({ calibratedOn: '2026-11-30' }),
    expect: adminWrites(404),
  },
  {
    route: 'GET /api/catalogue/components/:id/versions',
    method: 'get',
    path: () => `/api/catalogue/components/${ids.component}/versions`,
    // The surgeon of the matrix works in another practice: its catalogue is not this one.
    expect: all(200, { surgeon: 404, otherPracticeDentist: 404 }),
  },
  {
    route: 'GET /api/catalogue/components/:id/versions (another practice)',
    method: 'get',
    path: () => `/api/catalogue/components/${ids.quarryComponent}/versions`,
    expect: all(404, { otherPracticeDentist: 200 }),
  },
  {
    route: 'GET /api/patients/:id/restorable-sites (shared)',
    method: 'get',
    path: () => `/api/patients/${ids.harold}/restorable-sites`,
    expect: sharedRead(),
  },
  {
    route: 'GET /api/patients/:id/restorable-sites (not shared)',
    method: 'get',
    path: () => `/api/patients/${ids.okafor}/restorable-sites`,
    expect: unsharedRead(),
  },
  {
    route: 'GET /api/patients/:id/restorations (shared)',
    method: 'get',
    path: () => `/api/patients/${ids.harold}/restorations`,
    expect: sharedRead(),
  },
  {
    route: 'GET /api/patients/:id/restorations (another practice)',
    method: 'get',
    path: () => `/api/patients/${ids.quarryPatient}/restorations`,
    expect: otherPracticeRead(),
  },
  {
    route: 'POST /api/restorations',
    method: 'post',
    path: () => '/api/restorations',
    body: wendellPlan,
    expect: dentistWrites(201),
  },
  {
    route: 'GET /api/restorations/:id (shared)',
    method: 'get',
    path: () => `/api/restorations/${ids.haroldBridge}`,
    expect: sharedRead(),
  },
  {
    route: 'GET /api/restorations/:id (not shared)',
    method: 'get',
    path: () => `/api/restorations/${ids.okaforCrown}`,
    expect: unsharedRead(),
  },
  {
    route: 'GET /api/restorations/:id (no such id)',
    method: 'get',
    path: () => '/api/restorations/00000000-0000-4000-8000-000000000000',
    expect: all(404),
  },
  {
    route: 'GET /api/restorations/:id (not a uuid)',
    method: 'get',
    path: () => '/api/restorations/36',
    expect: all(404),
  },
  {
    route: 'GET /api/lab-prescriptions/:id/pdf (no such id)',
    method: 'get',
    path: () => '/api/lab-prescriptions/00000000-0000-4000-8000-000000000000/pdf',
    expect: all(404),
    check: pdf,
  },
  {
    route: 'POST /api/restorations/:id/amendments',
    method: 'post',
    path: async () => `/api/restorations/${await freshPlan()}/amendments`,
    body: () => ({
      ...wendellPlan(),
      patientId: undefined,
      shade: 'A1',
      amendmentReason: 'Shade changed after try-in',
    }),
    expect: dentistWrites(201),
  },
  {
    route: 'POST /api/restorations/:id/delivery',
    method: 'post',
    path: async () => `/api/restorations/${await freshPlan()}/delivery`,
    body: () => ({
      deliveredOn: '2026-11-30',
      parts: [{ siteId: ids.wendell15, componentId: tex('PSI'), lot: 'PSI-1' }],
    }),
    expect: dentistWrites(200),
  },
  {
    route: 'POST /api/restorations/:id/lab-prescriptions',
    method: 'post',
    path: () => `/api/restorations/${ids.haroldBridge}/lab-prescriptions`,
    body: () => ({}),
    expect: dentistWrites(201),
  },
  {
    route: 'GET /api/lab-prescriptions/:id/pdf (shared)',
    method: 'get',
    path: () => `/api/lab-prescriptions/${ids.labPrescription}/pdf`,
    // It names the lab and its address, which no share opens (issue 12).
    expect: unsharedRead(),
    check: pdf,
  },
  {
    route: 'GET /api/lab-prescriptions/:id/pdf (not shared)',
    method: 'get',
    path: () => `/api/lab-prescriptions/${ids.okaforLab}/pdf`,
    expect: unsharedRead(),
    check: pdf,
  },
  {
    route: 'POST /api/torque-events',
    method: 'post',
    path: () => '/api/torque-events',
    body: () => ({
      componentInstanceId: ids.haroldScrew,
      appliedNcm: 25,
      reason: 're-torque-at-recall',
      wrenchId: ids.wrench,
    }),
    expect: dentistWrites(201),
  },
  {
    route: 'POST /api/torque-events (not shared)',
    method: 'post',
    path: () => '/api/torque-events',
    body: () => ({ componentInstanceId: ids.okaforScrew, appliedNcm: 30, reason: 're-torque-at-recall' }),
    expect: dentistWrites(201),
  },
  {
    route: 'POST /api/torque-events/:id/amendments',
    method: 'post',
    path: async () => `/api/torque-events/${await freshTorque()}/amendments`,
    body: () => ({
      appliedNcm: 24,
      performedAt: '2025-01-10T10:00:00Z',
      amendmentReason: 'Typed 25, the wrench read 24',
    }),
    expect: dentistWrites(201),
  },
  {
    route: 'POST /api/complications',
    method: 'post',
    path: () => '/api/complications',
    body: () => ({ siteId: ids.harold35, kind: 'veneer-chipping', occurredOn: '2025-03-03' }),
    expect: dentistWrites(201),
  },
  {
    route: 'POST /api/complications/:id/amendments',
    method: 'post',
    path: async () => `/api/complications/${await freshComplication()}/amendments`,
    body: () => ({ kind: 'screw-loosening', occurredOn: '2024-02-02', amendmentReason: 'Wrong kind chosen' }),
    expect: dentistWrites(201),
  },
  {
    route: 'GET /api/sites/:id/timeline (shared)',
    method: 'get',
    path: () => `/api/sites/${ids.harold35}/timeline`,
    expect: sharedRead(),
  },
  {
    route: 'GET /api/sites/:id/timeline (not shared)',
    method: 'get',
    path: () => `/api/sites/${ids.okafor46}/timeline`,
    expect: unsharedRead(),
  },
  {
    route: 'GET /api/sites/:id/timeline (another practice)',
    method: 'get',
    path: () => `/api/sites/${ids.quarry36}/timeline`,
    expect: otherPracticeRead(),
  },
];

describeRoleMatrix(() => ctx, matrix);
