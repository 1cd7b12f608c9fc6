// Fuzzing every write endpoint from its zod contract: bodies drawn from the contract's JSON
// Schema (real ids of the scenario mixed with random ones), with hostile strings, numbers, raw
// number texts (1e999 …) and wrong shapes injected into one field, plus broken JSON. Each
// endpoint gets a few hundred cases within a time budget. No reply may be a 5xx, and a refused
// request may leave no row behind: the row count of every table is compared before and after.
import { randomUUID } from 'node:crypto';
import { apiRoutes, plainWordingProblems } from '@torquetrail/contracts';
import { sql } from 'drizzle-orm';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { components, implantSites, patientShares, patients, platforms, scanFiles } from '../src/db/schema/index.js';
import {
  arbitraryFor,
  hostileValue,
  type JsonSchema,
  leafPaths,
  replaceAt,
  toJsonText,
} from './support/json-schema-arbitrary.js';
import { AUDIT_EXPECTATIONS } from './support/audit-expectations.js';
import { actorCookies } from './support/role-matrix.js';
import { scenarioTargets } from './support/scenario-targets.js';
import { type AccountKey, startTestApp } from './support/test-app.js';
import { freshEmail, throwawayAccount } from './support/people.js';

const ctx = await startTestApp();
afterAll(() => ctx.close());
const cookies = await actorCookies(ctx);
const t = await scenarioTargets(ctx, cookies);
/** The demo's scan file (Wendell's digital impression), for the scan-body markers. */
const [demoScanFile] = await ctx.db.select({ id: scanFiles.id }).from(scanFiles).limit(1);

/** Every id of the scenario's patients, sites, platforms and parts, of both practices. */
const uuids = [
  ...(await ctx.db.select({ id: patients.id }).from(patients)),
  ...(await ctx.db.select({ id: implantSites.id }).from(implantSites)),
  ...(await ctx.db.select({ id: platforms.id }).from(platforms)),
  ...(await ctx.db.select({ id: components.id }).from(components)),
  ...(await ctx.db.select({ id: patientShares.id }).from(patientShares)),
  { id: t.haroldScrew.id },
  { id: t.wrench.id },
].map((r) => r.id);

/** A new patient of Larkspur Lane (created through the API), archived when asked. */
async function freshPatient(archived = false): Promise<string> {
  const res = await ctx.http
    .post('/api/patients')
    .set('Cookie', cookies.dentist)
    .send({ givenName: 'Fuzzy', familyName: 'Target', birthDate: '1970-01-01' });
  const id = (res.body as { id: string }).id;
  if (archived)
    await ctx.http
      .post(`/api/patients/${id}/archive`)
      .set('Cookie', cookies.dentist)
      .send({ reason: 'For the fuzzer' });
  return id;
}
/** An invitation and a colleague of Larkspur of their own, for the people routes. */
const fuzzInvitation = async () =>
  (
    (
      await ctx.http
        .post('/api/people/invitations')
        .set('Cookie', cookies.practice_admin)
        .send({ email: freshEmail('fuzz.invitee'), role: 'hygienist' })
    ).body as { id: string }
  ).id;
/** A live share of a fresh patient with a surgeon of its own, for the revoke route. */
const fuzzShare = async () => {
  const surgeon = await throwawayAccount(ctx, 'surgeon');
  const res = await ctx.http
    .post(`/api/patients/${await freshPatient()}/shares`)
    .set('Cookie', cookies.dentist)
    .send({ surgeonEmail: surgeon.email, scopes: ['outcomes'], siteIds: null, endsOn: null, reason: 'For the fuzzer' });
  return (res.body as { id: string }).id;
};
const fuzzColleague = async () => (await throwawayAccount(ctx, 'dentist')).id;

/** Who calls each write endpoint (a role that may), and on which record. */
const TARGETS: Record<string, { as: AccountKey | null; path: string }> = {
  'POST /auth/sign-in': { as: null, path: '/api/auth/sign-in' },
  'POST /auth/sign-out': { as: null, path: '/api/auth/sign-out' },
  'POST /catalogue/systems': { as: 'practice_admin', path: '/api/catalogue/systems' },
  'PATCH /catalogue/systems/:id': { as: 'practice_admin', path: `/api/catalogue/systems/${t.system.id}` },
  'POST /catalogue/platforms': { as: 'practice_admin', path: '/api/catalogue/platforms' },
  'PATCH /catalogue/platforms/:id': {
    as: 'practice_admin',
    path: `/api/catalogue/platforms/${t.system.platforms[0].id}`,
  },
  'POST /catalogue/components': { as: 'practice_admin', path: '/api/catalogue/components' },
  'PATCH /catalogue/components/:id': {
    as: 'practice_admin',
    path: `/api/catalogue/components/${t.system.platforms[0].components[0].id}`,
  },
  'POST /wrenches': { as: 'practice_admin', path: '/api/wrenches' },
  'PATCH /wrenches/:id': { as: 'practice_admin', path: `/api/wrenches/${t.wrench.id}` },
  'POST /wrenches/:id/calibrations': { as: 'practice_admin', path: `/api/wrenches/${t.wrench.id}/calibrations` },
  // The upload's body is the file: a JSON body must be refused (415), never a 5xx.
  'POST /patients/:id/radiographs': { as: 'dentist', path: `/api/patients/${t.ids.harold}/radiographs` },
  'POST /radiographs/:id/entered-in-error': {
    as: 'dentist',
    path: `/api/radiographs/${await t.fresh.radiograph()}/entered-in-error`,
  },
  'POST /radiographs/:id/measurements': {
    as: 'dentist',
    path: `/api/radiographs/${await t.fresh.radiograph()}/measurements`,
  },
  'POST /radiograph-measurements/:id/amendments': {
    as: 'dentist',
    path: `/api/radiograph-measurements/${await t.fresh.measurement()}/amendments`,
  },
  'POST /restorations/:id/seating-checks': {
    as: 'dentist',
    path: `/api/restorations/${t.haroldBridge}/seating-checks`,
  },
  'POST /seating-checks/:id/amendments': {
    as: 'dentist',
    path: `/api/seating-checks/${await t.fresh.seatingCheck()}/amendments`,
  },
  'POST /restorations/:id/impressions': {
    as: 'dentist',
    path: `/api/restorations/${await t.fresh.plan()}/impressions`,
  },
  'POST /impressions/:id/scan-files': {
    as: 'dentist',
    path: `/api/impressions/${await t.fresh.impression()}/scan-files`,
  },
  'POST /scan-files/:id/markers': {
    as: 'dentist',
    path: `/api/scan-files/${demoScanFile.id}/markers`,
  },
  'POST /impressions/:id/amendments': {
    as: 'dentist',
    path: `/api/impressions/${await t.fresh.impression()}/amendments`,
  },
  'POST /restorations': { as: 'dentist', path: '/api/restorations' },
  'POST /restorations/:id/amendments': { as: 'dentist', path: `/api/restorations/${await t.fresh.plan()}/amendments` },
  'POST /restorations/:id/delivery': { as: 'dentist', path: `/api/restorations/${await t.fresh.plan()}/delivery` },
  'POST /restorations/:id/lab-prescriptions': {
    as: 'dentist',
    path: `/api/restorations/${t.haroldBridge}/lab-prescriptions`,
  },
  'POST /patients/:id/referral-summary/mails': {
    as: 'dentist',
    path: `/api/patients/${t.ids.harold}/referral-summary/mails`,
  },
  'POST /torque-events': { as: 'dentist', path: '/api/torque-events' },
  'POST /restorations/:id/seat': { as: 'dentist', path: `/api/restorations/${t.haroldBridge}/seat` },
  'POST /torque-events/:id/amendments': {
    as: 'dentist',
    path: `/api/torque-events/${await t.fresh.torque()}/amendments`,
  },
  'POST /complications': { as: 'dentist', path: '/api/complications' },
  'POST /complications/:id/amendments': {
    as: 'dentist',
    path: `/api/complications/${await t.fresh.complication()}/amendments`,
  },
  'POST /insert-changes': { as: 'hygienist', path: '/api/insert-changes' },
  'POST /insert-changes/:id/amendments': {
    as: 'hygienist',
    path: `/api/insert-changes/${await t.fresh.insertChange()}/amendments`,
  },
  'POST /recalls/visits': { as: 'hygienist', path: '/api/recalls/visits' },
  'POST /recalls/exams/:id/amend': { as: 'hygienist', path: `/api/recalls/exams/${await t.fresh.exam()}/amend` },
  'PUT /recalls/policy': { as: 'practice_admin', path: '/api/recalls/policy' },
  'POST /recalls/reminders/run': { as: 'practice_admin', path: '/api/recalls/reminders/run' },
  'POST /people/invitations': { as: 'practice_admin', path: '/api/people/invitations' },
  'POST /people/invitations/:id/resend': {
    as: 'practice_admin',
    path: `/api/people/invitations/${await fuzzInvitation()}/resend`,
  },
  'POST /people/invitations/:id/revoke': {
    as: 'practice_admin',
    path: `/api/people/invitations/${await fuzzInvitation()}/revoke`,
  },
  'PUT /people/:id/role': { as: 'practice_admin', path: `/api/people/${await fuzzColleague()}/role` },
  'POST /people/:id/deactivation': { as: 'practice_admin', path: `/api/people/${await fuzzColleague()}/deactivation` },
  'PUT /practice/session-settings': { as: 'practice_admin', path: '/api/practice/session-settings' },
  'PUT /practice/wrench-settings': { as: 'practice_admin', path: '/api/practice/wrench-settings' },
  'PUT /practice/impression-settings': { as: 'practice_admin', path: '/api/practice/impression-settings' },
  'PUT /practice/cantilever-settings': { as: 'practice_admin', path: '/api/practice/cantilever-settings' },
  'PUT /practice/insert-review-settings': { as: 'practice_admin', path: '/api/practice/insert-review-settings' },
  'PUT /practice/contact': { as: 'practice_admin', path: '/api/practice/contact' },
  'POST /patients/:id/shares': { as: 'dentist', path: `/api/patients/${await freshPatient()}/shares` },
  'POST /shares/:id/revoke': { as: 'dentist', path: `/api/shares/${await fuzzShare()}/revoke` },
  'PUT /auth/password': { as: 'dentist', path: '/api/auth/password' },
  'POST /account/invitation': { as: null, path: '/api/account/invitation' },
  'POST /account/invitation/accept': { as: null, path: '/api/account/invitation/accept' },
  'POST /account/password-reset': { as: null, path: '/api/account/password-reset' },
  'POST /account/password-reset/look-up': { as: null, path: '/api/account/password-reset/look-up' },
  'POST /account/password-reset/complete': { as: null, path: '/api/account/password-reset/complete' },
  // The import's body is the file: a JSON body is refused (415), with or without a valid query.
  'POST /imports/dry-run': { as: 'practice_admin', path: `/api/imports/dry-run?fileName=f.csv&runId=${randomUUID()}` },
  'POST /imports': { as: 'practice_admin', path: '/api/imports' },
  'POST /patients/:id/sites': { as: 'dentist', path: `/api/patients/${t.ids.lucia}/sites` },
  'POST /patients': { as: 'dentist', path: '/api/patients' },
  'PATCH /patients/:id': { as: 'dentist', path: `/api/patients/${await freshPatient()}` },
  'POST /patients/:id/archive': { as: 'dentist', path: `/api/patients/${await freshPatient()}/archive` },
  'POST /patients/:id/unarchive': { as: 'dentist', path: `/api/patients/${await freshPatient(true)}/unarchive` },
  'PUT /practice/patient-settings': { as: 'practice_admin', path: '/api/practice/patient-settings' },
  'POST /sites/:id/placements': { as: 'dentist', path: `/api/sites/${await t.fresh.site()}/placements` },
  'POST /placements/:id/amendments': { as: 'dentist', path: `/api/placements/${await t.fresh.placement()}/amendments` },
  'POST /patients/:id/passport/mails': { as: 'dentist', path: `/api/patients/${t.ids.harold}/passport/mails` },
};

/**
 * Row counts of every table of the schema, in one round trip. The audit trail is left out: it
 * records each refusal by design (issue 11), checked per request below.
 */
const tableNames = (
  await ctx.db.execute<{ tablename: string }>(sql`select tablename from pg_tables where schemaname = 'public'`)
).rows
  .map((r) => r.tablename)
  .filter((name) => name !== 'audit_events');
/** Whether Express's JSON parser (strict: an object or an array; an empty body is none) lets the body through. */
function reachesRoute(raw: string): boolean {
  if (raw.trim() === '') return true;
  try {
    const parsed: unknown = JSON.parse(raw);
    return typeof parsed === 'object' && parsed !== null;
  } catch {
    return false;
  }
}

/** The outcomes of the audit rows one request left (by its request id). */
async function auditOutcomes(requestId: string | undefined): Promise<string[]> {
  const res = await ctx.db.execute<{ outcome: string }>(
    sql`select outcome from audit_events where request_id = ${requestId ?? ''}`,
  );
  return res.rows.map((r) => r.outcome);
}
async function rowCounts(): Promise<Record<string, number>> {
  const parts = tableNames.map((n) => `'${n}', (select count(*) from "${n}")`).join(', ');
  const res = await ctx.db.execute<{ counts: Record<string, number> }>(
    sql.raw(`select json_build_object(${parts}) as counts`),
  );
  return res.rows[0].counts;
}

/** Whole bodies that are not a JSON object, or not JSON. */
const BROKEN_BODIES = [
  '',
  '{',
  '[]',
  'null',
  '"text"',
  '1e999',
  '{"a":1e999}',
  `${'['.repeat(5000)}${']'.repeat(5000)}`,
  '{"__proto__":{"x":1}}',
];

const writes = apiRoutes.filter((r) => r.method !== 'get');
const BUDGET_MS = 2_000;
const RUNS = 300;
const figures = { endpoints: 0, cases: 0, serverErrors: 0 };

describe('fuzzing every write endpoint', () => {
  it('has a target for every write route of the contracts', () => {
    expect(writes.map((r) => `${r.method.toUpperCase()} ${r.path}`).filter((k) => !(k in TARGETS))).toEqual([]);
  });

  it.each(writes.map((r) => ({ key: `${r.method.toUpperCase()} ${r.path}`, route: r })))(
    '$key answers no 5xx and leaves no row behind a refusal',
    async ({ key, route }) => {
      const target = TARGETS[key];
      const schema = route.body
        ? (z.toJSONSchema(route.body, { io: 'input', unrepresentable: 'any' }) as JsonSchema)
        : { type: 'object' };
      const valid = arbitraryFor(schema, uuids);
      const body = fc.oneof(
        { weight: 2, arbitrary: valid },
        {
          weight: 5,
          arbitrary: valid.chain((v) => {
            const paths = leafPaths(v);
            return fc.tuple(fc.constantFrom(...paths), hostileValue).map(([p, h]) => replaceAt(v, p, h));
          }),
        },
      );
      const text = fc.oneof(
        { weight: 12, arbitrary: body.map(toJsonText) },
        { weight: 1, arbitrary: fc.constantFrom(...BROKEN_BODIES) },
      );
      let before = await rowCounts();
      let cases = 0;
      const send = async (raw: string) => {
        let req = ctx.http[route.method](target.path).set('Content-Type', 'application/json');
        if (target.as) req = req.set('Cookie', cookies[target.as]);
        const res = await req.send(raw);
        cases += 1;
        return res;
      };
      // The time budget is checked before each case rather than with fast-check's
      // interruptAfterTimeLimit, which abandons a request in flight: its row would then land
      // during the next endpoint's cases and read as a row left behind.
      const deadline = Date.now() + BUDGET_MS;
      await fc.assert(
        fc.asyncProperty(text, async (raw) => {
          if (Date.now() > deadline) return;
          const res = await send(raw);
          if (res.status >= 500) figures.serverErrors += 1;
          expect(res.status, `${raw.slice(0, 300)} → ${JSON.stringify(res.body)}`).toBeLessThan(500);
          const after = await rowCounts();
          // Only a refusal must leave the counts as they were; an accepted write moves the baseline.
          // Every sentence of a refusal is plain words (paths and library wording once reached users).
          const sentences =
            res.status >= 400 ? [String(res.body.message), ...Object.values<string>(res.body.fields ?? {})] : [];
          expect(
            sentences.filter((m) => plainWordingProblems(m).length > 0),
            raw.slice(0, 300),
          ).toEqual([]);
          const expected = res.status >= 400 ? before : after;
          expect(after, `rows left behind by ${raw.slice(0, 300)} → ${res.status}`).toEqual(expected);
          // Exactly one audit row with the request's outcome: a refusal is recorded, never lost. A
          // body that is not a JSON object or array is refused by the body parser before any route
          // (or user) is known, and a sign-out without a session names no one: those leave none.
          // Routes the trail does not audit (the public link pages, one's own password) leave none.
          const audited = AUDIT_EXPECTATIONS[`${route.method.toUpperCase()} /api${route.path}`] != null;
          const reachedRoute = reachesRoute(raw) && !(target.as === null && route.path === '/auth/sign-out');
          // A sign-in refused by its throttle (429) is stopped by a guard before the route: it is
          // in the log, not in the trail (a known gap, in the issue note).
          const throttled = res.status === 429;
          expect(await auditOutcomes(res.headers['x-request-id'])).toEqual(
            reachedRoute && audited && !throttled ? [res.status >= 400 ? 'refused' : 'allowed'] : [],
          );
          before = after;
        }),
        { numRuns: RUNS, endOnFailure: true },
      );
      figures.endpoints += 1;
      figures.cases += cases;
      expect(cases).toBeGreaterThan(0);
    },
    30_000,
  );
});

// Issue 9, item 5: each of these answered 500 before the contracts refused control characters
// and out-of-range dates (PostgreSQL cannot store NUL in text, nor year 0).
describe('control characters and out-of-range dates are a 400 naming the field', () => {
  const complication = { siteId: t.ids.harold35, kind: 'other', occurredOn: '2024-02-02' };
  it.each([
    ['a NUL in notes', '/api/complications', { ...complication, notes: 'Chipped\u0000' }, 'notes'],
    ['a year-0000 date', '/api/complications', { ...complication, occurredOn: '0000-01-01' }, 'occurredOn'],
    [
      'a year-0000 instant',
      '/api/torque-events',
      {
        componentInstanceId: t.haroldScrew.id,
        appliedNcm: 25,
        reason: 're-torque-at-recall',
        performedAt: '0000-01-01T00:00:00Z',
      },
      'performedAt',
    ],
    ['a NUL in a lot', `/api/sites/${t.ids.lucia14}/placements`, { ...t.placement(), lot: 'L\u0000' }, 'lot'],
  ])('%s', async (_, path, body, field) => {
    const before = await rowCounts();
    const res = await ctx.http.post(path).set('Cookie', cookies.dentist).send(body);
    expect(res.status).toBe(400);
    expect(res.body.fields).toHaveProperty(field);
    expect(await rowCounts()).toEqual(before);
  });

  it.each(['/api/patients', '/api/recalls/desk', '/api/recalls/desk/csv'])(
    'a NUL in the search of %s',
    async (path) => {
      const res = await ctx.http.get(path).query({ search: 'Whit\u0000' }).set('Cookie', cookies.dentist);
      expect(res.status).toBe(400);
      // The CSV route's error reply keeps the route's text/csv header, so read the JSON from the text.
      expect(JSON.parse(res.text).fields).toHaveProperty('search');
    },
  );
});

afterAll(() => {
  console.log(
    `[figures] fuzzing: ${figures.endpoints} write endpoints, ${figures.cases} cases, ${figures.serverErrors} answers of 500 or more`,
  );
});
