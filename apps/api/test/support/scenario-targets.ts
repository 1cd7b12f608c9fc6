// Real targets in the seeded scenario for tests that call every route: ids of Larkspur records
// shared with the Northgate surgeon, catalogue parts, and makers of fresh records (through the
// API, as the role that may make them) for routes that change or amend one.
import { eq } from 'drizzle-orm';
import { componentInstances, implantSites, torqueWrenches } from '../../src/db/schema/index.js';
import { larkspurId, parts, platformId } from './ledger-fixtures.js';
import { jpeg } from './radiograph-fixtures.js';
import { type AccountKey, patientId, siteId, type TestContext } from './test-app.js';

export async function scenarioTargets(ctx: TestContext, cookies: Record<AccountKey, string>) {
  const larkspur = await larkspurId(ctx.db);
  const tex = await parts(ctx.db, larkspur, 'Tessely EX 4.1');
  const mhx = await parts(ctx.db, larkspur, 'Miravik HX 4.1');
  const ids = {
    harold: await patientId(ctx.db, 'LL-1001'),
    lucia: await patientId(ctx.db, 'LL-1004'),
    wendell: await patientId(ctx.db, 'LL-1005'),
    harold35: await siteId(ctx.db, 'LL-1001', 35),
    lucia14: await siteId(ctx.db, 'LL-1004', 14),
    wendell15: await siteId(ctx.db, 'LL-1005', 15),
    wendell16: await siteId(ctx.db, 'LL-1005', 16),
    scn35: await platformId(ctx.db, larkspur, 'Solvra CN 3.5'),
    /** Beatrix Lindqvist's stud overdenture site (not shared) and the demo inserts. */
    beatrix33: await siteId(ctx.db, 'LL-1006', 33),
    insertMedium: mhx('RI-M'),
    insertStrong: mhx('RI-S'),
  };
  const [haroldScrew] = await ctx.db
    .select({ id: componentInstances.id })
    .from(componentInstances)
    .where(eq(componentInstances.siteId, ids.harold35));
  const [system] = (await ctx.http.get('/api/catalogue').set('Cookie', cookies.practice_admin)).body.systems as {
    id: string;
    platforms: { id: string; components: { id: string }[] }[];
  }[];
  const [wrench] = await ctx.db
    .select({ id: torqueWrenches.id })
    .from(torqueWrenches)
    .where(eq(torqueWrenches.practiceId, larkspur));
  const haroldBridge = (await ctx.http.get(`/api/patients/${ids.harold}/restorations`).set('Cookie', cookies.dentist))
    .body.items[0].id as string;
  const labPrescription = (
    await ctx.http.post(`/api/restorations/${haroldBridge}/lab-prescriptions`).set('Cookie', cookies.dentist).send({})
  ).body.id as string;

  /** Free permanent positions of Lucía Ferraz (shared), one per call. */
  const taken = new Set(
    (
      await ctx.db.select({ fdi: implantSites.fdi }).from(implantSites).where(eq(implantSites.patientId, ids.lucia))
    ).map((s) => s.fdi),
  );
  const freeFdi = [1, 2, 3, 4]
    .flatMap((q) => [1, 2, 3, 4, 5, 6, 7, 8].map((t) => q * 10 + t))
    .filter((f) => !taken.has(f));
  const nextFdi = () => {
    const f = freeFdi.shift();
    if (f === undefined) throw new Error('no free position left');
    return f;
  };

  const created = async (res: { status: number; body: { id?: string } }, what: string) => {
    if (res.status !== 201) throw new Error(`fixture ${what} failed: ${res.status} ${JSON.stringify(res.body)}`);
    return res.body.id!;
  };
  const plan = () => ({
    patientId: ids.wendell,
    kind: 'splinted-bridge',
    retention: 'screw-to-implant',
    material: 'zirconia',
    copingsSplinted: true,
    sites: [ids.wendell15, ids.wendell16].map((s) => ({
      siteId: s,
      interface: 'non-engaging',
      impressionCoping: 'non-engaging',
      screwComponentIds: [tex('PSI')],
      impressionCopingComponentId: tex('ICN-O'),
    })),
  });
  const placement = () => ({ platformId: ids.scn35, placedOn: '2026-01-05', lengthMm: 11.5 });
  const exam = (site: string) => ({
    siteId: site,
    sites: ['mesiobuccal', 'buccal', 'distobuccal', 'mesiolingual', 'lingual', 'distolingual'].map((position) => ({
      position,
      probingDepthMm: 3,
      bleeding: false,
      suppuration: false,
    })),
    mobility: false,
  });
  /** A radiograph of Harold's 35 (shared with the surgeon), a new image each call (the same bytes twice are a 409). */
  let grey = 0;
  const radiograph = async () => {
    const res = await ctx.http
      .post(`/api/patients/${ids.harold}/radiographs?siteIds=${ids.harold35}`)
      .set('Cookie', cookies.dentist)
      .set('Content-Type', 'application/octet-stream')
      .send(await jpeg(8, 8, (grey += 1)));
    return created(res, 'radiograph');
  };
  const measurementPoints = {
    platform: [
      { row: 10, col: 20 },
      { row: 10, col: 40 },
    ],
    apex: { row: 210, col: 30 },
    mesial: { row: 40, col: 21 },
    distal: { row: 30, col: 39 },
  };
  const measurement = async () =>
    created(
      await ctx.http
        .post(`/api/radiographs/${await radiograph()}/measurements`)
        .set('Cookie', cookies.dentist)
        .send({ siteId: ids.harold35, points: measurementPoints }),
      'measurement',
    );

  /**
   * The current version of the seating check of Harold's bridge delivery, new each call: the first
   * call records it, later ones amend whatever version is current (a test may have amended it).
   */
  const seatingCheck = async () => {
    const checks = (
      await ctx.http.get(`/api/restorations/${haroldBridge}/seating-checks`).set('Cookie', cookies.dentist)
    ).body.items as { id: string; event: string; current: boolean }[];
    const current = checks.find((c) => c.event === 'delivery' && c.current);
    const body = { radiographId: await radiograph(), seated: 'yes' };
    return created(
      current
        ? await ctx.http
            .post(`/api/seating-checks/${current.id}/amendments`)
            .set('Cookie', cookies.dentist)
            .send({ ...body, reason: 'A clearer radiograph of the seating' })
        : await ctx.http
            .post(`/api/restorations/${haroldBridge}/seating-checks`)
            .set('Cookie', cookies.dentist)
            .send({ ...body, event: 'delivery' }),
      'seating check',
    );
  };

  const freshPlan = async () =>
    created(await ctx.http.post('/api/restorations').set('Cookie', cookies.dentist).send(plan()), 'plan');
  /** A digital impression of a new plan for Wendell's 15 and 16, with a scan body at each. */
  const impression = async () =>
    created(
      await ctx.http
        .post(`/api/restorations/${await freshPlan()}/impressions`)
        .set('Cookie', cookies.dentist)
        .send({
          method: 'digital',
          takenOn: '2026-11-20',
          scanBodies: [ids.wendell15, ids.wendell16].map((site, i) => ({
            siteId: site,
            componentId: tex('SB'),
            lot: `SB-FIX-${i + 1}`,
          })),
        }),
      'impression',
    );

  const fresh = {
    radiograph,
    measurement,
    seatingCheck,
    impression,
    plan: freshPlan,
    site: async () =>
      created(
        await ctx.http.post(`/api/patients/${ids.lucia}/sites`).set('Cookie', cookies.dentist).send({ fdi: nextFdi() }),
        'site',
      ),
    placement: async () =>
      created(
        await ctx.http
          .post(`/api/sites/${await fresh.site()}/placements`)
          .set('Cookie', cookies.dentist)
          .send(placement()),
        'placement',
      ),
    torque: async () =>
      created(
        await ctx.http.post('/api/torque-events').set('Cookie', cookies.dentist).send({
          componentInstanceId: haroldScrew.id,
          appliedNcm: 25,
          reason: 're-torque-at-recall',
          performedAt: '2025-01-10T10:00:00Z',
        }),
        'torque',
      ),
    complication: async () =>
      created(
        await ctx.http
          .post('/api/complications')
          .set('Cookie', cookies.dentist)
          .send({ siteId: ids.harold35, kind: 'other', occurredOn: '2024-02-02' }),
        'complication',
      ),
    insertChange: async () =>
      created(
        await ctx.http.post('/api/insert-changes').set('Cookie', cookies.dentist).send({
          siteId: ids.beatrix33,
          changedOn: '2025-06-02',
          oldComponentId: ids.insertMedium,
          newComponentId: ids.insertMedium,
          reason: 'wear',
        }),
        'insert change',
      ),
    exam: async () => {
      const res = await ctx.http
        .post('/api/recalls/visits')
        .set('Cookie', cookies.hygienist)
        .send({ patientId: ids.lucia, examinedOn: '2026-01-05', exams: [exam(ids.lucia14)] });
      if (res.status !== 201) throw new Error(`fixture exam failed: ${res.status} ${JSON.stringify(res.body)}`);
      return res.body.exams[0].id as string;
    },
  };

  return {
    ids,
    tex,
    haroldScrew,
    system,
    wrench,
    haroldBridge,
    labPrescription,
    nextFdi,
    plan,
    placement,
    exam,
    fresh,
    measurementPoints,
  };
}
