// Route × actor matrix generated from the router: every route Express serves under /api is found
// at run time and called by each actor — the three Larkspur Lane roles, the Northgate surgeon
// (shared into LL-1001, LL-1002, LL-1004, LL-1005), a second Northgate surgeon with no share
// (made here: the seed has none), the Quarry Hill dentist and no session. The expected statuses
// live in ONE table keyed by "METHOD /path"; a served route without a row fails, so a new route
// cannot be forgotten. Targets are Larkspur records shared with the surgeon unless a row says
// otherwise; routes that change data get a fresh target per call, so the order does not matter.
import { randomUUID } from 'node:crypto';
import { apiRoutes } from '@torquetrail/contracts';
import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { invitations, patientShares, users } from '../src/db/schema/index.js';
import { AUDIT_EXPECTATIONS, auditChecks, expectAuditRows, nextXid } from './support/audit-expectations.js';
import { actorCookies, all, type Expected } from './support/role-matrix.js';
import { ACCOUNTS, patientId, startTestApp } from './support/test-app.js';
import { throwawayAccount } from './support/people.js';
import { asciiStl } from './support/mesh-fixtures.js';
import { jpeg, waitForPreview } from './support/radiograph-fixtures.js';
import { scenarioTargets } from './support/scenario-targets.js';
import { servedRoutes } from './support/served-routes.js';

type Actor = keyof Expected | 'surgeonNoShare';
type Expect7 = Record<Actor, number>;
const ACTORS: readonly Actor[] = [
  'dentist',
  'hygienist',
  'practice_admin',
  'surgeon',
  'surgeonNoShare',
  'otherPracticeDentist',
  'anonymous',
];

interface Case {
  /** Which record, when the route is called on more than one. */
  target: string;
  path: () => string | Promise<string>;
  body?: () => object | Promise<object>;
  /** A binary body (an upload), sent with its content type instead of JSON. */
  raw?: () => Promise<{ type: string; data: Buffer }>;
  expect: Expect7;
  /** A session of its own per actor (sign-out would end the shared one). */
  ownSession?: boolean;
}

const ctx = await startTestApp();
afterAll(() => ctx.close());
const cookies = await actorCookies(ctx);
const [northgate] = await ctx.db.select().from(users).where(eq(users.email, ACCOUNTS.surgeon));
/** A copy of an account (same practice, role and password), without its shares. */
async function cloneAccount(email: string, as: string) {
  const [u] = await ctx.db.select().from(users).where(eq(users.email, email));
  await ctx.db.insert(users).values({
    practiceId: u.practiceId,
    email: as,
    displayName: `${u.displayName} (copy)`,
    role: u.role,
    passwordHash: u.passwordHash,
  });
}
await cloneAccount(northgate.email, 'surgeon.no-share@northgate.example');
const noShareAccounts = { ...ACCOUNTS, surgeonNoShare: 'surgeon.no-share@northgate.example' } as const;
const signInAs = async (email: string) => {
  const res = await ctx.http.post('/api/auth/sign-in').send({ email, password: 'ledger-demo-2026' });
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status}`);
  return ([] as string[])
    .concat(res.headers['set-cookie'] ?? [])
    .find((c) => c.startsWith('tt_session='))!
    .split(';')[0];
};
/** Sign-out ends every session of its user: each actor signs out as a copy of their account. */
const signOutAccount = (actor: Exclude<Actor, 'anonymous'>) => `sign-out.${actor.toLowerCase()}@copies.example`;
for (const actor of ACTORS) {
  if (actor !== 'anonymous') await cloneAccount(noShareAccounts[actor], signOutAccount(actor));
}
const cookieOf: Record<Actor, string | undefined> = {
  ...cookies,
  surgeonNoShare: await signInAs(noShareAccounts.surgeonNoShare),
  anonymous: undefined,
};

const {
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
} = await scenarioTargets(ctx, cookies);
const radiograph = await fresh.radiograph();
// Previews are made by the job queue after the upload: the preview and thumbnail rows read them.
await waitForPreview(ctx.http, cookies.dentist, radiograph);
/** A new patient of Larkspur Lane for each call that changes one (archived when asked). */
async function freshPatient(archived = false): Promise<string> {
  const res = await ctx.http
    .post('/api/patients')
    .set('Cookie', cookies.dentist)
    .send({ givenName: 'Matrix', familyName: 'Target', birthDate: '1971-01-01' });
  const id = (res.body as { id: string }).id;
  if (archived)
    await ctx.http
      .post(`/api/patients/${id}/archive`)
      .set('Cookie', cookies.dentist)
      .send({ reason: 'For the matrix' });
  return id;
}
const [odile] = await ctx.db.select().from(users).where(eq(users.email, ACCOUNTS.practice_admin));
const [nell] = await ctx.db.select().from(users).where(eq(users.email, ACCOUNTS.otherPracticeDentist));
let freshCount = 0;
/** A Larkspur invitation of its own per call (re-sent or withdrawn by the case). */
const freshInvitation = async () => {
  freshCount += 1;
  const [row] = await ctx.db
    .insert(invitations)
    .values({
      practiceId: odile.practiceId,
      email: `matrix.invitee.${freshCount}@larkspur.example`,
      role: 'hygienist',
      invitedBy: odile.id,
      linkOrigin: 'http://127.0.0.1',
    })
    .returning({ id: invitations.id });
  return row.id;
};
/** A Larkspur dentist of its own per call (role changed or deactivated by the case). */
const freshColleague = async () => {
  freshCount += 1;
  const [row] = await ctx.db
    .insert(users)
    .values({
      practiceId: odile.practiceId,
      email: `matrix.colleague.${freshCount}@larkspur.example`,
      displayName: `Colleague ${freshCount}`,
      role: 'dentist',
      passwordHash: odile.passwordHash,
    })
    .returning({ id: users.id });
  return row.id;
};
/** A Northgate surgeon of their own per call, to share a patient with. */
const freshSurgeon = async () => (await throwawayAccount(ctx, 'surgeon')).email;
/** A live share of Harold with a surgeon of its own per call (revoked by the case). */
const freshShare = async () => {
  const [row] = await ctx.db
    .insert(patientShares)
    .values({
      practiceId: odile.practiceId,
      patientId: ids.harold,
      sharedWithUserId: (await throwawayAccount(ctx, 'surgeon')).id,
      sharedByUserId: odile.id,
      scopes: ['outcomes'],
      reason: 'For the matrix',
    })
    .returning({ id: patientShares.id });
  return row.id;
};
/** A well-formed link token nobody was sent. */
const unknownToken = 'Zq'.repeat(21) + 'Q';
let uploadGrey = 100;
let importFiles = 0;
/** A legacy import file of its own per call: the required columns and a numbered unknown one. */
const importFile = () =>
  Buffer.from(`event,chart_number,family_name,given_name,birth_date,fdi,date,matrix_${(importFiles += 1)}\r\n`);
const dentistRun = randomUUID();
await ctx.http
  .post(`/api/imports/dry-run?fileName=progress.csv&runId=${dentistRun}`)
  .set('Cookie', cookies.dentist)
  .set('Content-Type', 'application/octet-stream')
  .send(importFile());

// ---- the expectations -----------------------------------------------------------------------
/** `status` for every signed-in actor and 401 without a session, with exceptions. */
const every = (status: number, over: Partial<Expect7> = {}): Expect7 => ({
  ...all(status),
  surgeonNoShare: status,
  ...over,
});
const publicRoute = (status: number): Expect7 => every(status, { anonymous: status });
/** A read of a Larkspur record shared with the surgeon. */
const sharedRead = every(200, { surgeonNoShare: 404, otherPracticeDentist: 404 });
/** Catalogue, wrenches, policy: the practice admin only (the guard refuses every other role). */
const adminOnly = (ok: number) => every(403, { practice_admin: ok });
/** Clinical writes of the dentist; another practice's record is 404. */
const dentistWrite = (ok: number) => every(403, { dentist: ok, otherPracticeDentist: 404 });
/** Placements: the dentist and the surgeon through a share. */
const placementWrite = (ok: number) =>
  every(403, { dentist: ok, surgeon: ok, surgeonNoShare: 404, otherPracticeDentist: 404 });
const [haroldShare] = await ctx.db
  .select({ id: patientShares.id })
  .from(patientShares)
  .where(eq(patientShares.patientId, ids.harold));
/** The referral summary: read by the practice and the shared surgeon; sent by the dentist and admin. */
const referralRead = every(200, { hygienist: 403, surgeonNoShare: 403, otherPracticeDentist: 404 });
/** The lot look-up: the dentist and the admin, each over their own practice only. */
const lotLookup = every(403, { dentist: 200, practice_admin: 200, otherPracticeDentist: 200 });
/** The legacy import: the dentist and the practice admin, each in their own practice. */
const importers = (ok: number) => every(403, { dentist: ok, practice_admin: ok, otherPracticeDentist: ok });
const one = (c: Omit<Case, 'target'>, target = 'shared Larkspur record'): Case[] => [{ target, ...c }];
let scanScale = 1;
let scanFile: string | undefined;
/** One scan file of a digital impression of Wendell's (shared with the surgeon), made on first use. */
async function storedScanFile(): Promise<string> {
  if (scanFile) return scanFile;
  const res = await ctx.http
    .post(`/api/impressions/${await fresh.impression()}/scan-files`)
    .set('Cookie', cookies.dentist)
    .set('Content-Type', 'application/octet-stream')
    .send(asciiStl(1000));
  if (res.status !== 201) throw new Error(`fixture scan file failed: ${res.status}`);
  scanFile = res.body.id as string;
  return scanFile;
}

const TABLE: Record<string, Case[]> = {
  'GET /api/health': one({ path: () => '/api/health', expect: publicRoute(200) }, 'public'),
  'GET /api/health/ready': one({ path: () => '/api/health/ready', expect: publicRoute(200) }, 'public'),
  'GET /api/health/live': one({ path: () => '/api/health/live', expect: publicRoute(200) }, 'public'),
  // A second dentist signs in for every actor: the actors' own sessions stay untouched.
  'POST /api/auth/sign-in': one(
    {
      path: () => '/api/auth/sign-in',
      body: () => ({ email: 'tomasz.brill@larkspur.example', password: 'ledger-demo-2026' }),
      expect: publicRoute(200),
    },
    'public',
  ),
  'POST /api/auth/sign-out': one(
    { path: () => '/api/auth/sign-out', expect: publicRoute(204), ownSession: true },
    'own session',
  ),
  'GET /api/auth/me': one({ path: () => '/api/auth/me', expect: every(200) }, 'own user'),
  'GET /api/patients': one({ path: () => '/api/patients', expect: every(200) }, 'scoped list'),
  'GET /api/patients/:id': [
    { target: 'shared', path: () => `/api/patients/${ids.harold}`, expect: sharedRead },
    {
      target: 'another practice',
      path: async () => `/api/patients/${await patientId(ctx.db, 'QH-2001')}`,
      expect: every(404, { otherPracticeDentist: 200 }),
    },
  ],
  // Patients' records: the dentist and the practice admin create, edit and archive; the hygienist
  // edits contact details only; a Quarry Hill dentist creates in their own practice.
  'POST /api/patients': one(
    {
      path: () => '/api/patients',
      body: () => ({ givenName: 'Matrix', familyName: 'Created', birthDate: '1980-05-05' }),
      expect: every(403, { dentist: 201, practice_admin: 201, otherPracticeDentist: 201 }),
    },
    'new',
  ),
  'PATCH /api/patients/:id': one({
    path: () => `/api/patients/${ids.harold}`,
    body: () => ({ phone: '+44 20 7946 0555' }),
    expect: every(200, { surgeon: 403, surgeonNoShare: 403, otherPracticeDentist: 404 }),
  }),
  'POST /api/patients/:id/archive': one(
    {
      path: async () => `/api/patients/${await freshPatient()}/archive`,
      body: () => ({ reason: 'Moved away' }),
      expect: every(403, { dentist: 200, practice_admin: 200, otherPracticeDentist: 404 }),
    },
    'own practice',
  ),
  'POST /api/patients/:id/unarchive': one(
    {
      path: async () => `/api/patients/${await freshPatient(true)}/unarchive`,
      body: () => ({ reason: 'Came back' }),
      expect: every(403, { dentist: 200, practice_admin: 200, otherPracticeDentist: 404 }),
    },
    'own practice',
  ),
  'GET /api/patients/:id/versions': one({
    path: () => `/api/patients/${ids.harold}/versions`,
    expect: every(403, { dentist: 200, practice_admin: 200, otherPracticeDentist: 404 }),
  }),
  'GET /api/patients/duplicates': one(
    {
      path: () => '/api/patients/duplicates?familyName=Whitcombe&birthDate=1955-04-17',
      expect: every(403, { dentist: 200, practice_admin: 200, otherPracticeDentist: 200 }),
    },
    'own practice',
  ),
  'GET /api/practice/patient-settings': one(
    { path: () => '/api/practice/patient-settings', expect: every(200) },
    'own practice',
  ),
  'PUT /api/practice/patient-settings': one(
    { path: () => '/api/practice/patient-settings', body: () => ({ chartPrefix: 'LL-' }), expect: adminOnly(200) },
    'own practice',
  ),
  'GET /api/sites/:id': one({ path: () => `/api/sites/${ids.harold35}`, expect: sharedRead }),
  'GET /api/catalogue': one({ path: () => '/api/catalogue', expect: every(200) }, 'own practice'),
  'POST /api/catalogue/systems': one(
    {
      path: () => '/api/catalogue/systems',
      body: () => ({ name: 'Ostrava TX', manufacturer: 'Ostrava Implants' }),
      expect: adminOnly(201),
    },
    'new',
  ),
  'PATCH /api/catalogue/systems/:id': one(
    {
      path: () => `/api/catalogue/systems/${system.id}`,
      body: () => ({ manufacturer: 'Solvra Dental AG' }),
      expect: adminOnly(200),
    },
    'own practice',
  ),
  'POST /api/catalogue/platforms': one(
    {
      path: () => '/api/catalogue/platforms',
      body: () => ({
        systemId: system.id,
        name: 'CN 6.0',
        diameterMm: 6,
        connection: 'internal-conical',
        platformShift: true,
      }),
      expect: adminOnly(201),
    },
    'new',
  ),
  'PATCH /api/catalogue/platforms/:id': one(
    {
      path: () => `/api/catalogue/platforms/${system.platforms[0].id}`,
      body: () => ({ platformShift: true }),
      expect: adminOnly(200),
    },
    'own practice',
  ),
  'POST /api/catalogue/components': one(
    {
      path: () => '/api/catalogue/components',
      body: () => ({
        platformId: system.platforms[0].id,
        kind: 'abutment-screw',
        name: 'Screw, gold',
        referenceCode: 'ASG-1',
        torqueSpecNcm: 25,
        tolerancePct: 6,
      }),
      expect: adminOnly(201),
    },
    'new',
  ),
  'PATCH /api/catalogue/components/:id': one(
    {
      path: () => `/api/catalogue/components/${system.platforms[0].components[0].id}`,
      body: () => ({ tolerancePct: 8 }),
      expect: adminOnly(200),
    },
    'own practice',
  ),
  'GET /api/wrenches': one(
    { path: () => '/api/wrenches', expect: every(200, { surgeon: 403, surgeonNoShare: 403 }) },
    'own practice',
  ),
  'POST /api/wrenches': one(
    { path: () => '/api/wrenches', body: () => ({ label: 'Spring wrench C', type: 'spring' }), expect: adminOnly(201) },
    'new',
  ),
  'PATCH /api/wrenches/:id': one(
    {
      path: () => `/api/wrenches/${wrench.id}`,
      body: () => ({ label: 'Spring wrench A (relabelled)' }),
      expect: adminOnly(200),
    },
    'own practice',
  ),
  // Calibrations belong to the instrument (every version of the wrench): ADR 0006.
  // Radiographs of Harold's 35, shared with the surgeon (docs/authorization.md): dentist,
  // hygienist and the sharing surgeon upload, measure and mark; the practice admin reads.
  'GET /api/patients/:id/radiographs': one({
    path: () => `/api/patients/${ids.harold}/radiographs`,
    expect: sharedRead,
  }),
  'GET /api/radiographs/:id': one({ path: () => `/api/radiographs/${radiograph}`, expect: sharedRead }),
  'GET /api/radiographs/:id/original': one({
    path: () => `/api/radiographs/${radiograph}/original`,
    expect: sharedRead,
  }),
  'GET /api/radiographs/:id/preview': one({ path: () => `/api/radiographs/${radiograph}/preview`, expect: sharedRead }),
  'GET /api/radiographs/:id/thumbnail': one({
    path: () => `/api/radiographs/${radiograph}/thumbnail`,
    expect: sharedRead,
  }),
  'POST /api/patients/:id/radiographs': one({
    path: () => `/api/patients/${ids.harold}/radiographs`,
    raw: async () => ({ type: 'application/octet-stream', data: await jpeg(8, 8, (uploadGrey += 1)) }),
    expect: every(201, { practice_admin: 403, surgeonNoShare: 404, otherPracticeDentist: 404 }),
  }),
  'POST /api/radiographs/:id/measurements': one({
    path: () => `/api/radiographs/${radiograph}/measurements`,
    body: () => ({ siteId: ids.harold35, points: measurementPoints }),
    expect: every(201, { practice_admin: 403, surgeonNoShare: 404, otherPracticeDentist: 404 }),
  }),
  'POST /api/radiographs/:id/entered-in-error': one({
    path: async () => `/api/radiographs/${await fresh.radiograph()}/entered-in-error`,
    body: () => ({ reason: 'Filed to the wrong patient' }),
    expect: every(200, { practice_admin: 403, surgeonNoShare: 404, otherPracticeDentist: 404 }),
  }),
  'GET /api/sites/:id/bone-levels': one({ path: () => `/api/sites/${ids.harold35}/bone-levels`, expect: sharedRead }),
  'POST /api/radiograph-measurements/:id/amendments': one({
    path: async () => `/api/radiograph-measurements/${await fresh.measurement()}/amendments`,
    body: () => ({ points: measurementPoints, reason: 'Apex marked one thread too short' }),
    expect: every(201, { practice_admin: 403, surgeonNoShare: 404, otherPracticeDentist: 404 }),
  }),
  // Seating checks of Harold's bridge (shared with the surgeon): a write on the restoration's
  // record, so the dentist only; the hygienist files the radiograph but may not mark seating.
  'GET /api/restorations/:id/seating-checks': one({
    path: () => `/api/restorations/${haroldBridge}/seating-checks`,
    expect: sharedRead,
  }),
  'POST /api/restorations/:id/seating-checks': one({
    path: () => `/api/restorations/${haroldBridge}/seating-checks`,
    body: () => ({
      event: 'impression',
      radiographId: radiograph,
      seated: 'unsure',
      note: 'Coping margin hard to see',
    }),
    expect: dentistWrite(201),
  }),
  'POST /api/seating-checks/:id/amendments': one({
    path: async () => `/api/seating-checks/${await fresh.seatingCheck()}/amendments`,
    body: () => ({ radiographId: radiograph, seated: 'no', reason: 'Read again: a gap at the distal margin' }),
    expect: dentistWrite(201),
  }),
  // A restoration's impression and scan files: the practice's own team only, never a surgeon
  // (no share opens them); the dentist records and amends.
  'GET /api/restorations/:id/impressions': one({
    path: () => `/api/restorations/${haroldBridge}/impressions`,
    expect: every(200, { surgeon: 403, surgeonNoShare: 403, otherPracticeDentist: 404 }),
  }),
  'POST /api/restorations/:id/impressions': one({
    path: async () => `/api/restorations/${await fresh.plan()}/impressions`,
    body: () => ({ method: 'analog', takenOn: '2026-11-20' }),
    expect: dentistWrite(201),
  }),
  'POST /api/impressions/:id/amendments': one({
    path: async () => `/api/impressions/${await fresh.impression()}/amendments`,
    body: () => ({ takenOn: '2026-11-19', reason: 'Scanned the day before' }),
    expect: dentistWrite(201),
  }),
  'POST /api/impressions/:id/scan-files': one({
    path: async () => `/api/impressions/${await fresh.impression()}/scan-files`,
    raw: async () => ({ type: 'application/octet-stream', data: asciiStl((scanScale += 1)) }),
    expect: dentistWrite(201),
  }),
  'GET /api/scan-files/:id/file': one({
    path: async () => `/api/scan-files/${await storedScanFile()}/file`,
    expect: every(200, { surgeon: 403, surgeonNoShare: 403, otherPracticeDentist: 404 }),
  }),
  // Scan-body markers on a scan file: read as the impression is; placed (or moved) by the dentist.
  'GET /api/scan-files/:id/markers': one({
    path: async () => `/api/scan-files/${await storedScanFile()}/markers`,
    expect: every(200, { surgeon: 403, surgeonNoShare: 403, otherPracticeDentist: 404 }),
  }),
  'POST /api/scan-files/:id/markers': one({
    path: async () => `/api/scan-files/${await storedScanFile()}/markers`,
    body: () => ({ siteId: ids.wendell15, point: { x: 1, y: 2, z: (scanScale += 1) } }),
    expect: dentistWrite(201),
  }),
  'GET /api/lab-files/:token': one(
    { path: () => '/api/lab-files/bm90LWEtdG9rZW4.bm90LWEtc2lnbmF0dXJl', expect: publicRoute(404) },
    'public',
  ),
  'GET /api/wrenches/:id/calibrations': one(
    {
      path: () => `/api/wrenches/${wrench.id}/calibrations`,
      expect: every(200, { surgeon: 403, surgeonNoShare: 403, otherPracticeDentist: 404 }),
    },
    'own practice',
  ),
  'POST /api/wrenches/:id/calibrations': one(
    {
      path: () => `/api/wrenches/${wrench.id}/calibrations`,
      body: () => ({ calibratedOn: '2026-11-30', note: 'Bench check' }),
      expect: adminOnly(201),
    },
    'own practice',
  ),
  // The surgeons work in another practice: this catalogue's history is not theirs to read.
  'GET /api/catalogue/components/:id/versions': one(
    {
      path: () => `/api/catalogue/components/${system.platforms[0].components[0].id}/versions`,
      expect: every(200, { surgeon: 404, surgeonNoShare: 404, otherPracticeDentist: 404 }),
    },
    'own practice',
  ),
  'GET /api/patients/:id/restorable-sites': one({
    path: () => `/api/patients/${ids.harold}/restorable-sites`,
    expect: sharedRead,
  }),
  'GET /api/patients/:id/restorations': one({
    path: () => `/api/patients/${ids.harold}/restorations`,
    expect: sharedRead,
  }),
  'POST /api/restorations': one({ path: () => '/api/restorations', body: plan, expect: dentistWrite(201) }),
  'GET /api/restorations/:id': one({ path: () => `/api/restorations/${haroldBridge}`, expect: sharedRead }),
  'POST /api/restorations/:id/amendments': one({
    path: async () => `/api/restorations/${await fresh.plan()}/amendments`,
    body: () => ({ ...plan(), patientId: undefined, shade: 'A1', amendmentReason: 'Shade changed after try-in' }),
    expect: dentistWrite(201),
  }),
  'POST /api/restorations/:id/delivery': one({
    path: async () => `/api/restorations/${await fresh.plan()}/delivery`,
    body: () => ({
      deliveredOn: '2026-11-30',
      parts: [{ siteId: ids.wendell15, componentId: tex('PSI'), lot: 'PSI-1' }],
    }),
    expect: dentistWrite(200),
  }),
  'POST /api/restorations/:id/lab-prescriptions': one({
    path: () => `/api/restorations/${haroldBridge}/lab-prescriptions`,
    body: () => ({}),
    expect: dentistWrite(201),
  }),
  'GET /api/lab-prescriptions/:id/pdf': one({
    path: () => `/api/lab-prescriptions/${labPrescription}/pdf`,
    // It names the lab and its address, which no share opens (issue 12).
    expect: every(200, { surgeon: 404, surgeonNoShare: 404, otherPracticeDentist: 404 }),
  }),
  'POST /api/torque-events': one({
    path: () => '/api/torque-events',
    body: () => ({
      componentInstanceId: haroldScrew.id,
      appliedNcm: 25,
      reason: 're-torque-at-recall',
      wrenchId: wrench.id,
    }),
    expect: dentistWrite(201),
  }),
  // Seat restoration: every screw of Harold's bridge at once; reading the screws is a read of the restoration.
  'GET /api/restorations/:id/screws': one({
    path: () => `/api/restorations/${haroldBridge}/screws`,
    expect: sharedRead,
  }),
  'POST /api/restorations/:id/seat': one({
    path: () => `/api/restorations/${haroldBridge}/seat`,
    body: () => ({ wrenchId: wrench.id, screws: [{ componentInstanceId: haroldScrew.id, appliedNcm: 35 }] }),
    expect: dentistWrite(201),
  }),
  'POST /api/torque-events/:id/amendments': one({
    path: async () => `/api/torque-events/${await fresh.torque()}/amendments`,
    body: () => ({
      appliedNcm: 24,
      performedAt: '2025-01-10T10:00:00Z',
      amendmentReason: 'Typed 25, the wrench read 24',
    }),
    expect: dentistWrite(201),
  }),
  'POST /api/complications': one({
    path: () => '/api/complications',
    body: () => ({ siteId: ids.harold35, kind: 'veneer-chipping', occurredOn: '2025-03-03' }),
    expect: dentistWrite(201),
  }),
  'POST /api/complications/:id/amendments': one({
    path: async () => `/api/complications/${await fresh.complication()}/amendments`,
    body: () => ({ kind: 'screw-loosening', occurredOn: '2024-02-02', amendmentReason: 'Wrong kind chosen' }),
    expect: dentistWrite(201),
  }),
  // Insert changes: the dentist, and the hygienist at recall; no share opens them (Beatrix is not shared).
  'POST /api/insert-changes': one({
    path: () => '/api/insert-changes',
    body: () => ({
      siteId: ids.beatrix33,
      changedOn: '2025-09-09',
      oldComponentId: ids.insertMedium,
      newComponentId: ids.insertStrong,
      reason: 'retention-loss',
    }),
    expect: every(403, { dentist: 201, hygienist: 201, otherPracticeDentist: 404 }),
  }),
  'POST /api/insert-changes/:id/amendments': one({
    path: async () => `/api/insert-changes/${await fresh.insertChange()}/amendments`,
    body: () => ({
      changedOn: '2025-06-02',
      newComponentId: ids.insertMedium,
      reason: 'fracture',
      amendmentReason: 'It had split, not worn',
    }),
    expect: every(403, { dentist: 201, hygienist: 201, otherPracticeDentist: 404 }),
  }),
  'GET /api/sites/:id/timeline': one({ path: () => `/api/sites/${ids.harold35}/timeline`, expect: sharedRead }),
  'GET /api/recalls/desk': one({ path: () => '/api/recalls/desk', expect: every(200) }, 'scoped list'),
  'GET /api/recalls/desk/csv': one({ path: () => '/api/recalls/desk/csv', expect: every(200) }, 'scoped list'),
  'GET /api/lot-lookup': one(
    { path: () => '/api/lot-lookup?by=lot&q=SCN4310-12A07', expect: lotLookup },
    "the practice's own parts",
  ),
  'GET /api/lot-lookup/csv': one(
    { path: () => '/api/lot-lookup/csv?by=lot&q=SCN4310-12A07', expect: lotLookup },
    "the practice's own parts",
  ),
  'GET /api/patients/:id/referral-summary': one({
    path: () => `/api/patients/${ids.harold}/referral-summary`,
    expect: referralRead,
  }),
  'GET /api/patients/:id/referral-summary/pdf': one({
    path: () => `/api/patients/${ids.harold}/referral-summary/pdf`,
    expect: referralRead,
  }),
  'POST /api/patients/:id/referral-summary/mails': one({
    path: () => `/api/patients/${ids.harold}/referral-summary/mails`,
    body: () => ({ shareId: haroldShare.id, idempotencyKey: crypto.randomUUID() }),
    expect: every(403, { dentist: 201, practice_admin: 201, otherPracticeDentist: 404 }),
  }),
  'GET /api/outcomes': one({ path: () => '/api/outcomes', expect: every(200, { hygienist: 403 }) }, 'scoped list'),
  'GET /api/recalls/patients/:id/exam-context': one({
    path: () => `/api/recalls/patients/${ids.harold}/exam-context`,
    expect: sharedRead,
  }),
  'POST /api/recalls/visits': one({
    path: () => '/api/recalls/visits',
    body: () => ({ patientId: ids.lucia, examinedOn: '2026-01-05', exams: [exam(ids.lucia14)] }),
    expect: every(403, { hygienist: 201, dentist: 201, otherPracticeDentist: 404 }),
  }),
  'POST /api/recalls/exams/:id/amend': one({
    path: async () => `/api/recalls/exams/${await fresh.exam()}/amend`,
    body: () => ({ ...exam(ids.lucia14), siteId: undefined, mobility: true, amendmentReason: 'Mobility missed' }),
    expect: every(403, { hygienist: 201, dentist: 201, otherPracticeDentist: 404 }),
  }),
  'GET /api/recalls/sites/:id/exams': one({
    path: () => `/api/recalls/sites/${ids.harold35}/exams`,
    expect: sharedRead,
  }),
  'GET /api/recalls/policy': one(
    { path: () => '/api/recalls/policy', expect: every(200, { surgeon: 403, surgeonNoShare: 403 }) },
    'own practice',
  ),
  // The default policy: no other case sees a change.
  'PUT /api/recalls/policy': one(
    {
      path: () => '/api/recalls/policy',
      body: () => ({ baseMonths: 6, riskMonths: 3, reminderDaysBefore: 14, overdueReminderDaysAfter: 7 }),
      expect: adminOnly(200),
    },
    'own practice',
  ),
  'POST /api/recalls/reminders/run': one(
    { path: () => '/api/recalls/reminders/run', body: () => ({ today: '2000-01-01' }), expect: adminOnly(200) },
    'own practice',
  ),
  'GET /api/recalls/reminders': one({ path: () => '/api/recalls/reminders', expect: adminOnly(200) }, 'own practice'),
  // The audit trail (issue 11): the practice's whole trail is the admin's; one patient's is also the dentist's.
  // Legacy import (docs/import.md): the dentist and the admin of a practice, each into their own
  // practice. Each call sends a file of its own (an extra column makes its hash new): no rows, so it
  // writes only its import record, in the audit row's transaction.
  'POST /api/imports/dry-run': one(
    {
      path: () => `/api/imports/dry-run?fileName=matrix.csv&runId=${randomUUID()}`,
      raw: async () => ({ type: 'application/octet-stream', data: importFile() }),
      expect: importers(200),
    },
    'own practice',
  ),
  'POST /api/imports': one(
    {
      path: () => `/api/imports?fileName=matrix.csv&runId=${randomUUID()}`,
      raw: async () => ({ type: 'application/octet-stream', data: importFile() }),
      expect: importers(201),
    },
    'own practice',
  ),
  // Progress is the starter's own: the dentist's run, unknown (404) to everyone else.
  'GET /api/imports/progress/:runId': one(
    {
      path: () => `/api/imports/progress/${dentistRun}`,
      expect: every(403, { dentist: 200, practice_admin: 404, otherPracticeDentist: 404 }),
    },
    'own practice',
  ),
  'GET /api/audit': one({ path: () => `/api/audit?patientId=${ids.harold}`, expect: adminOnly(200) }, 'own practice'),
  'GET /api/audit/csv': one({ path: () => '/api/audit/csv?action=read', expect: adminOnly(200) }, 'own practice'),
  'GET /api/patients/:id/audit': one({
    path: () => `/api/patients/${ids.harold}/audit`,
    expect: every(403, { dentist: 200, practice_admin: 200, otherPracticeDentist: 404 }),
  }),
  // People and sign-in: the practice administrator only; another practice's user reads like a missing one.
  'GET /api/people': one({ path: () => '/api/people', expect: adminOnly(200) }, 'own practice'),
  'POST /api/people/invitations': one(
    {
      path: () => '/api/people/invitations',
      body: () => ({ email: `matrix.invited.${(freshCount += 1)}@larkspur.example`, role: 'hygienist' }),
      expect: adminOnly(201),
    },
    'own practice',
  ),
  'POST /api/people/invitations/:id/resend': one(
    { path: async () => `/api/people/invitations/${await freshInvitation()}/resend`, expect: adminOnly(200) },
    'own invitation',
  ),
  'POST /api/people/invitations/:id/revoke': one(
    { path: async () => `/api/people/invitations/${await freshInvitation()}/revoke`, expect: adminOnly(200) },
    'own invitation',
  ),
  'PUT /api/people/:id/role': [
    {
      target: 'own colleague',
      path: async () => `/api/people/${await freshColleague()}/role`,
      body: () => ({ role: 'hygienist' }),
      expect: adminOnly(200),
    },
    {
      target: 'another practice',
      path: () => `/api/people/${nell.id}/role`,
      body: () => ({ role: 'hygienist' }),
      expect: adminOnly(404),
    },
  ],
  'POST /api/people/:id/deactivation': [
    {
      target: 'own colleague',
      path: async () => `/api/people/${await freshColleague()}/deactivation`,
      expect: adminOnly(200),
    },
    { target: 'another practice', path: () => `/api/people/${nell.id}/deactivation`, expect: adminOnly(404) },
  ],
  'GET /api/practice/session-settings': one(
    { path: () => '/api/practice/session-settings', expect: every(200) },
    'own practice',
  ),
  'PUT /api/practice/wrench-settings': one(
    {
      path: () => '/api/practice/wrench-settings',
      body: () => ({ calibrationIntervalMonths: 12 }),
      expect: adminOnly(200),
    },
    'own practice',
  ),
  'GET /api/practice/impression-settings': one(
    { path: () => '/api/practice/impression-settings', expect: every(200) },
    'own practice',
  ),
  'PUT /api/practice/impression-settings': one(
    {
      path: () => '/api/practice/impression-settings',
      body: () => ({ requireScanBodyRadiograph: false }),
      expect: adminOnly(200),
    },
    'own practice',
  ),
  'GET /api/practice/cantilever-settings': one(
    { path: () => '/api/practice/cantilever-settings', expect: every(200) },
    'own practice',
  ),
  'PUT /api/practice/cantilever-settings': one(
    {
      path: () => '/api/practice/cantilever-settings',
      body: () => ({ cantileverRatioLimit: 1.5 }),
      expect: adminOnly(200),
    },
    'own practice',
  ),
  'GET /api/practice/insert-review-settings': one(
    { path: () => '/api/practice/insert-review-settings', expect: every(200) },
    'own practice',
  ),
  'PUT /api/practice/insert-review-settings': one(
    {
      path: () => '/api/practice/insert-review-settings',
      body: () => ({ insertReviewIntervalMonths: 12 }),
      expect: adminOnly(200),
    },
    'own practice',
  ),
  'PUT /api/practice/session-settings': one(
    {
      path: () => '/api/practice/session-settings',
      body: () => ({ idleSignOutMinutes: 15, dateFormat: 'day-month-year' }),
      expect: adminOnly(200),
    },
    'own practice',
  ),
  'GET /api/practice/contact': one({ path: () => '/api/practice/contact', expect: every(200) }, 'own practice'),
  'PUT /api/practice/contact': one(
    {
      path: () => '/api/practice/contact',
      body: () => ({ address: '14 Larkspur Lane, Eastbridge', phone: '+44 20 7946 0123', email: null }),
      expect: adminOnly(200),
    },
    'own practice',
  ),
  // Shares (issue 12): the dentist shares and revokes, the practice admin reads; a surgeon never
  // sees the sharing side, and another practice's patient or share reads like a missing one.
  'GET /api/shares': one(
    { path: () => '/api/shares', expect: every(403, { dentist: 200, practice_admin: 200, otherPracticeDentist: 200 }) },
    'own practice',
  ),
  'GET /api/patients/:id/shares': one({
    path: () => `/api/patients/${ids.harold}/shares`,
    expect: every(403, { dentist: 200, practice_admin: 200, otherPracticeDentist: 404 }),
  }),
  'POST /api/patients/:id/shares': one({
    path: () => `/api/patients/${ids.harold}/shares`,
    body: async () => ({
      surgeonEmail: await freshSurgeon(),
      scopes: ['outcomes'],
      siteIds: null,
      endsOn: null,
      reason: 'For the matrix',
    }),
    expect: every(403, { dentist: 201, otherPracticeDentist: 404 }),
  }),
  'POST /api/shares/:id/revoke': one({
    path: async () => `/api/shares/${await freshShare()}/revoke`,
    body: () => ({ reason: 'For the matrix' }),
    expect: every(403, { dentist: 200, otherPracticeDentist: 404 }),
  }),
  // Records out: the FHIR export for the dentist and the admin; passport and card for the dentist.
  'GET /api/patients/:id/fhir': one({
    path: () => `/api/patients/${ids.harold}/fhir`,
    expect: every(403, { dentist: 200, practice_admin: 200, otherPracticeDentist: 404 }),
  }),
  'GET /api/patients/:id/passport.pdf': one({
    path: () => `/api/patients/${ids.harold}/passport.pdf`,
    expect: dentistWrite(200),
  }),
  'GET /api/patients/:id/retrieval-card.pdf': one({
    path: () => `/api/patients/${ids.harold}/retrieval-card.pdf`,
    expect: dentistWrite(200),
  }),
  'GET /api/patients/:id/passport/mails': one({
    path: () => `/api/patients/${ids.harold}/passport/mails`,
    expect: dentistWrite(200),
  }),
  'POST /api/patients/:id/passport/mails': one({
    path: () => `/api/patients/${ids.harold}/passport/mails`,
    body: () => ({}),
    expect: dentistWrite(201),
  }),
  // A wrong current password: nobody's password changes, every signed-in actor gets the field error.
  'PUT /api/auth/password': one(
    {
      path: () => '/api/auth/password',
      body: () => ({ currentPassword: 'not-the-password', newPassword: 'Tidewater lantern 49' }),
      expect: every(400),
    },
    'own account',
  ),
  'POST /api/account/invitation': one(
    { path: () => '/api/account/invitation', body: () => ({ token: unknownToken }), expect: publicRoute(404) },
    'public',
  ),
  'POST /api/account/invitation/accept': one(
    {
      path: () => '/api/account/invitation/accept',
      body: () => ({ token: unknownToken, displayName: 'Nobody', password: 'Tidewater lantern 49' }),
      expect: publicRoute(404),
    },
    'public',
  ),
  'POST /api/account/password-reset': one(
    {
      path: () => '/api/account/password-reset',
      body: () => ({ email: 'nobody.here@larkspur.example' }),
      expect: publicRoute(200),
    },
    'public',
  ),
  'POST /api/account/password-reset/look-up': one(
    {
      path: () => '/api/account/password-reset/look-up',
      body: () => ({ token: unknownToken }),
      expect: publicRoute(404),
    },
    'public',
  ),
  'POST /api/account/password-reset/complete': one(
    {
      path: () => '/api/account/password-reset/complete',
      body: () => ({ token: unknownToken, password: 'Tidewater lantern 49' }),
      expect: publicRoute(404),
    },
    'public',
  ),
  // The surgeon adds sites only in their own practice: a shared patient of Larkspur is 403.
  'POST /api/patients/:id/sites': one({
    path: () => `/api/patients/${ids.lucia}/sites`,
    body: () => ({ fdi: nextFdi() }),
    expect: every(403, { dentist: 201, surgeonNoShare: 404, otherPracticeDentist: 404 }),
  }),
  'GET /api/sites/:id/placement-options': one({
    path: () => `/api/sites/${ids.lucia14}/placement-options`,
    expect: placementWrite(200),
  }),
  'POST /api/sites/:id/placements': one({
    path: async () => `/api/sites/${await fresh.site()}/placements`,
    body: placement,
    expect: placementWrite(201),
  }),
  'POST /api/placements/:id/amendments': one({
    path: async () => `/api/placements/${await fresh.placement()}/amendments`,
    body: () => ({ ...placement(), lengthMm: 13, amendmentReason: 'Length misread from the box' }),
    expect: placementWrite(201),
  }),
};

// ---- the run --------------------------------------------------------------------------------
const served = servedRoutes(ctx.app);
let cases = 0;

describe('route × actor matrix', () => {
  it('has a row for every served route and no row for a route that is not served', () => {
    expect(
      served.filter((r) => !(r in TABLE)),
      'served routes missing from the table',
    ).toEqual([]);
    expect(
      Object.keys(TABLE).filter((r) => !served.includes(r)),
      'rows without a route',
    ).toEqual([]);
  });

  it('knows the audit row of every route of the contracts, and of no other', () => {
    const contracted = apiRoutes.map((r) => `${r.method.toUpperCase()} /api${r.path}`).sort();
    expect(Object.keys(AUDIT_EXPECTATIONS).sort()).toEqual(contracted);
  });

  describe.each(served.flatMap((route) => (TABLE[route] ?? []).map((c) => ({ route, ...c }))))(
    '$route ($target)',
    (row) => {
      it.each(ACTORS)('as %s', async (actor) => {
        const [method] = row.route.split(' ');
        const path = await row.path();
        let req = ctx.http[method.toLowerCase() as 'get' | 'post' | 'put' | 'patch'](path);
        const cookie =
          row.ownSession && actor !== 'anonymous' ? await signInAs(signOutAccount(actor)) : cookieOf[actor];
        if (cookie) req = req.set('Cookie', cookie);
        const raw = row.raw ? await row.raw() : null;
        const body = row.body ? await row.body() : null;
        const xidBefore = await nextXid(ctx);
        const res = raw
          ? await req.set('Content-Type', raw.type).send(raw.data)
          : body
            ? await req.send(body)
            : await req;
        cases += 1;
        expect(res.status, JSON.stringify(res.body)).toBe(row.expect[actor]);
        // The audit trail (issue 11): exactly the row this call must leave, found by its request id.
        // Sign-in names its user by the e-mail it sends; any other body's e-mail is someone else's
        // (an invitee), and the session says who acts.
        const who =
          row.route === 'POST /api/auth/sign-in' && body && 'email' in body
            ? String(body.email)
            : actor === 'anonymous'
              ? null
              : row.ownSession
                ? signOutAccount(actor)
                : noShareAccounts[actor];
        await expectAuditRows(ctx, row.route, res, who, xidBefore);
        // A refusal of another practice's record reads like a missing record.
        // oxlint-disable-next-line vitest/no-conditional-expect
        if (res.status === 404) expect(res.body.message).toMatch(/^No such/);
      });
    },
  );
});

afterAll(() => {
  console.log(`[figures] route × actor matrix: ${served.length} routes × ${ACTORS.length} actors = ${cases} cases run`);
  console.log(`[figures] audit trail: ${auditChecks()} calls checked for exactly their audit rows`);
});
