// Who may do what with radiographs (docs/authorization.md): dentist and hygienist upload, measure
// and mark entered-in-error in their practice; the surgeon only on a shared patient; the practice
// administrator reads; the other practice gets 404 everywhere.
import { beforeAll, afterAll, describe, expect, it } from 'vitest';
import { actorCookies, all, describeRoleMatrix, sharedRead, unsharedRead } from './support/role-matrix.js';
import { dicomFile, jpeg, waitForPreview } from './support/radiograph-fixtures.js';
import { patientId, signIn, siteId, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let dentist: string;
let harold: string;
let desmond: string;
let site35: string;
let sharedRadiograph: string;
let unsharedRadiograph: string;
let desmond46: string;
let unsharedSiteRadiograph: string;
let grey = 0;

const upload = async (patient: string, query = '') => {
  const res = await ctx.http
    .post(`/api/patients/${patient}/radiographs${query}`)
    .set('Cookie', dentist)
    .set('Content-Type', 'application/octet-stream')
    .send(await jpeg(8, 8, ++grey));
  if (res.status !== 201) throw new Error(`upload failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.id as string;
};

beforeAll(async () => {
  ctx = await startTestApp();
  dentist = await signIn(ctx, 'dentist');
  harold = await patientId(ctx.db, 'LL-1001');
  desmond = await patientId(ctx.db, 'LL-1003');
  site35 = await siteId(ctx.db, 'LL-1001', 35);
  sharedRadiograph = await upload(harold, `?siteIds=${site35}`);
  unsharedRadiograph = await upload(desmond);
  desmond46 = await siteId(ctx.db, 'LL-1003', 46);
  unsharedSiteRadiograph = await upload(desmond, `?siteIds=${desmond46}`);
  // previews are made by the job queue; the matrix reads them
  await waitForPreview(ctx.http, dentist, sharedRadiograph);
  await waitForPreview(ctx.http, dentist, unsharedRadiograph);
});

/** A fresh measurement by the dentist (each amendment needs a current version of its own). */
const measurement = async (radiograph: string, site: string) => {
  const res = await ctx.http
    .post(`/api/radiographs/${radiograph}/measurements`)
    .set('Cookie', dentist)
    .send({ siteId: site, points });
  if (res.status !== 201) throw new Error(`measurement failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.id as string;
};
afterAll(() => ctx.close());

const points = {
  platform: [
    { row: 10, col: 20 },
    { row: 10, col: 40 },
  ],
  apex: { row: 210, col: 30 },
  mesial: { row: 40, col: 21 },
  distal: { row: 30, col: 39 },
};

describeRoleMatrix(
  () => ctx,
  [
    {
      route: 'GET /api/patients/:id/radiographs (shared)',
      path: () => `/api/patients/${harold}/radiographs`,
      expect: sharedRead(),
    },
    {
      route: 'GET /api/patients/:id/radiographs (not shared)',
      path: () => `/api/patients/${desmond}/radiographs`,
      expect: unsharedRead(),
    },
    {
      route: 'GET /api/radiographs/:id (shared)',
      path: () => `/api/radiographs/${sharedRadiograph}`,
      expect: sharedRead(),
    },
    {
      route: 'GET /api/radiographs/:id (not shared)',
      path: () => `/api/radiographs/${unsharedRadiograph}`,
      expect: unsharedRead(),
    },
    {
      route: 'GET /api/radiographs/:id/original (shared)',
      path: () => `/api/radiographs/${sharedRadiograph}/original`,
      expect: sharedRead(),
    },
    {
      route: 'GET /api/radiographs/:id/preview (not shared)',
      path: () => `/api/radiographs/${unsharedRadiograph}/preview`,
      expect: unsharedRead(),
    },
    {
      route: 'GET /api/radiographs/:id/thumbnail (shared)',
      path: () => `/api/radiographs/${sharedRadiograph}/thumbnail`,
      expect: sharedRead(),
    },
    {
      route: 'POST /api/radiographs/:id/measurements (shared)',
      method: 'post',
      path: () => `/api/radiographs/${sharedRadiograph}/measurements`,
      body: () => ({ siteId: site35, points }),
      expect: all(201, { practice_admin: 403, otherPracticeDentist: 404 }),
    },
    {
      route: 'GET /api/sites/:id/bone-levels (shared)',
      path: () => `/api/sites/${site35}/bone-levels`,
      expect: sharedRead(),
    },
    {
      route: 'GET /api/sites/:id/bone-levels (not shared)',
      path: () => `/api/sites/${desmond46}/bone-levels`,
      expect: unsharedRead(),
    },
    {
      route: 'POST /api/radiographs/:id/measurements (not shared)',
      method: 'post',
      path: () => `/api/radiographs/${unsharedSiteRadiograph}/measurements`,
      body: () => ({ siteId: desmond46, points }),
      expect: all(201, { surgeon: 404, practice_admin: 403, otherPracticeDentist: 404 }),
    },
    {
      route: 'POST /api/radiograph-measurements/:id/amendments (shared, a fresh measurement each)',
      method: 'post',
      path: async () => `/api/radiograph-measurements/${await measurement(sharedRadiograph, site35)}/amendments`,
      body: () => ({ points, reason: 'Apex marked one thread short' }),
      expect: all(201, { practice_admin: 403, otherPracticeDentist: 404 }),
    },
    {
      route: 'POST /api/radiograph-measurements/:id/amendments (not shared, a fresh measurement each)',
      method: 'post',
      path: async () =>
        `/api/radiograph-measurements/${await measurement(unsharedSiteRadiograph, desmond46)}/amendments`,
      body: () => ({ points, reason: 'Apex marked one thread short' }),
      expect: all(201, { surgeon: 404, practice_admin: 403, otherPracticeDentist: 404 }),
    },
    {
      route: 'POST /api/radiographs/:id/entered-in-error (shared, a fresh radiograph each)',
      method: 'post',
      path: async () => `/api/radiographs/${await upload(harold)}/entered-in-error`,
      body: () => ({ reason: 'Filed to the wrong patient' }),
      expect: all(200, { practice_admin: 403, otherPracticeDentist: 404 }),
    },
    {
      route: 'POST /api/radiographs/:id/entered-in-error (not shared)',
      method: 'post',
      path: async () => `/api/radiographs/${await upload(desmond)}/entered-in-error`,
      body: () => ({ reason: 'Filed to the wrong patient' }),
      expect: all(200, { surgeon: 404, practice_admin: 403, otherPracticeDentist: 404 }),
    },
  ],
);

describe('POST /api/patients/:id/radiographs (binary body, so outside the JSON matrix)', () => {
  const expected = {
    shared: { dentist: 201, hygienist: 201, surgeon: 201, practice_admin: 403, otherPracticeDentist: 404 },
    'not shared': { dentist: 201, hygienist: 201, surgeon: 404, practice_admin: 403, otherPracticeDentist: 404 },
  } as const;
  it.each(['shared', 'not shared'] as const)('%s patient, every actor', async (which) => {
    const cookies = await actorCookies(ctx);
    const patient = which === 'shared' ? harold : desmond;
    for (const [actor, status] of Object.entries(expected[which])) {
      const res = await ctx.http
        .post(`/api/patients/${patient}/radiographs`)
        .set('Cookie', cookies[actor as keyof typeof cookies])
        .set('Content-Type', 'application/octet-stream')
        .send(await jpeg(8, 8, ++grey));
      expect(res.status, `${actor}: ${JSON.stringify(res.body)}`).toBe(status);
    }
    const anonymous = await ctx.http
      .post(`/api/patients/${patient}/radiographs`)
      .set('Content-Type', 'application/octet-stream')
      .send(await jpeg(8, 8, ++grey));
    expect(anonymous.status).toBe(401);
  });
});

describe('preview of a transfer syntax the server cannot decode', () => {
  it('is stored, and the preview answers "preview not available: transfer syntax … is not supported"', async () => {
    // Explicit VR Big Endian (retired) is native but not decoded by the preview: the same path as a compressed one
    const file = dicomFile({
      rows: 4,
      columns: 4,
      bits: 8,
      photometric: 'MONOCHROME2',
      pixel: () => 9,
      transferSyntax: '1.2.840.10008.1.2.2',
    });
    const res = await ctx.http
      .post(`/api/patients/${harold}/radiographs`)
      .set('Cookie', dentist)
      .set('Content-Type', 'application/octet-stream')
      .send(file);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const done = await waitForPreview(ctx.http, dentist, res.body.id);
    expect(done).toMatchObject({
      previewStatus: 'unavailable',
      previewProblem: 'preview not available: transfer syntax Explicit VR Big Endian is not supported',
    });
    const preview = await ctx.http.get(`/api/radiographs/${res.body.id}/preview`).set('Cookie', dentist);
    expect(preview.status).toBe(422);
    expect(preview.body.message).toBe(done.previewProblem);
    expect((await ctx.http.get(`/api/radiographs/${res.body.id}/original`).set('Cookie', dentist)).status).toBe(200);
  });
});
