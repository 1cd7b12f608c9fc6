// Least privilege in EVERY reply a shared surgeon can get (issue 12), checked in the replies
// themselves. The walk takes every GET route of packages/contracts/src/routes.ts (a new route
// whose `:param` this file cannot fill fails the first test), calls each as a surgeon of another
// practice whose share of Harold Whitcombe has each scope, over all sites or over site 35 only
// (the chosen-sites share also ends today, and one of site 35's exams is moved to tomorrow), and
// fails on anything the issue forbids anywhere in the JSON (or the text of a CSV): contact details,
// risk factors, notes, staff names other than the signing clinician, the lab's name and address,
// rows of a site not shared, entries dated after the share's last day. Files a surgeon may never
// need (the lab prescription, which names the lab) must not be served at all.
import { apiRoutes } from '@torquetrail/contracts';
import { eq, sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { patientShares } from '../src/db/schema/index.js';
import { signInAs, throwawayAccount } from './support/people.js';
import { patientId, signIn, siteId, startTestApp } from './support/test-app.js';
import { replyBytes } from './support/reply-bytes.js';

const ctx = await startTestApp();
afterAll(() => ctx.close());
const harold = await patientId(ctx.db, 'LL-1001');
const site35 = await siteId(ctx.db, 'LL-1001', 35);
const today = new Date().toISOString().slice(0, 10);
const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
const [dentist] = await ctx.db
  .select({ id: patientShares.sharedByUserId, practiceId: patientShares.practiceId })
  .from(patientShares)
  .where(eq(patientShares.patientId, harold))
  .limit(1);

const rows = async <T>(query: ReturnType<typeof sql>) => (await ctx.db.execute(query)).rows as T[];
const one = async (query: ReturnType<typeof sql>) => (await rows<{ id: string }>(query))[0]?.id;

// Site 35's latest exam is moved to tomorrow: a share ending today must not serve it.
const movedExam = await one(
  sql`select id from recall_exams where site_id = ${site35} order by examined_on desc limit 1`,
);
await ctx.db.execute(sql`update recall_exams set examined_on = ${tomorrow}::date where id = ${movedExam}`);

/** Harold's sites other than 35, and the ids of every record that hangs off them only. */
const otherSites = (
  await rows<{ id: string }>(sql`select id from implant_sites where patient_id = ${harold} and id <> ${site35}`)
).map((r) => r.id);
const others = `{${otherSites.join(',')}}`;
const otherSiteRecords = (
  await rows<{ id: string }>(sql`
    select id from placements where site_id = any(${others}::uuid[])
    union all select id from recall_exams where site_id = any(${others}::uuid[])
    union all select id from component_instances where site_id = any(${others}::uuid[])
    union all select id from complications where site_id = any(${others}::uuid[])
    union all select id from radiograph_measurements where site_id = any(${others}::uuid[])
    union all select radiograph_id from radiograph_sites rs where site_id = any(${others}::uuid[])
      and not exists (select 1 from radiograph_sites o where o.radiograph_id = rs.radiograph_id and o.site_id = ${site35})`)
).map((r) => r.id);

/** Words no reply to the surgeon may hold: the patient's contact, the lab, the practice's staff. */
const [contact] = await rows<{ email: string | null; phone: string | null }>(
  sql`select email, phone from patients where id = ${harold}`,
);
const labs = await rows<{ lab_name: string | null; lab_email: string | null }>(
  sql`select lab_name, lab_email from restorations where patient_id = ${harold}`,
);
const signers = new Set(
  (
    await rows<{ name: string }>(sql`select surgeon_name as name from placements p
  join implant_sites s on s.id = p.site_id where s.patient_id = ${harold}`)
  ).map((r) => r.name),
);
const staff = (
  await rows<{ name: string }>(sql`select display_name as name from users where practice_id = ${dentist.practiceId}`)
)
  .map((r) => r.name)
  .filter((name) => !signers.has(name));
const FORBIDDEN_WORDS = [
  contact.email,
  contact.phone,
  ...labs.flatMap((l) => [l.lab_name, l.lab_email]),
  ...staff,
].filter((w): w is string => Boolean(w));

/** Keys the issue forbids in a surgeon's reply, wherever they sit. */
const FORBIDDEN_KEY =
  /^(riskFactors|smoker|diabetesPoorlyControlled|periodontitisHistory|priorPeriImplantitis|contact|email\w*|phone\w*|\w*[aA]ddress|sex|missingTeeth|notes?|labName|labEmail|labPrescriptions|plannedByName|examinerName|uploadedBy|measuredBy|recordedBy|acknowledgements|amendmentReason|enteredInErrorReason|policy|originalName|sentTo|emailedTo)$/;
/** Keys holding the day an entry happened. */
const DATED =
  /^(at|placedOn|installedOn|performedAt|examinedOn|takenOn|measuredAt|recordedAt|uploadedAt|createdAt|deliveredOn)$/;

/** The ids the routes' params stand for, by the path before the param (a new kind fails the walk). */
const dentistCookie = await signIn(ctx, 'dentist');
const asDentist = async (path: string) => {
  const cookie = dentistCookie;
  return (await ctx.http.get(`/api${path}`).set('Cookie', cookie)).body as {
    items?: { id: string; sites?: { siteId: string }[] }[];
  };
};
const restorationsOf35 = (await asDentist(`/patients/${harold}/restorations`)).items?.filter((r) =>
  r.sites?.some((s) => s.siteId === site35),
);
const radiograph = await one(sql`select radiograph_id as id from radiograph_sites where site_id = ${site35} limit 1`);
// A lab prescription of site 35's restoration (it names the lab): the surgeon is never served it.
const madeFor = restorationsOf35?.[0]?.id;
const prescription = madeFor
  ? (
      (await ctx.http.post(`/api/restorations/${madeFor}/lab-prescriptions`).set('Cookie', dentistCookie).send({}))
        .body as { id?: string }
    ).id
  : undefined;
const anyOf = async (table: string) => one(sql`select id from ${sql.identifier(table)} limit 1`);
const NO_ROW = '00000000-0000-4000-8000-000000000000';
const PARAM_IDS: Record<string, string | undefined> = {
  '/patients/:id': harold,
  '/sites/:id': site35,
  '/recalls/patients/:id': harold,
  '/recalls/sites/:id': site35,
  '/restorations/:id': restorationsOf35?.[0]?.id,
  '/radiographs/:id': radiograph,
  '/lab-prescriptions/:id': prescription,
  // Not the patient's record: the surgeon's answers to these are refusals or their own practice's.
  '/catalogue/components/:id': await anyOf('components'),
  '/wrenches/:id': await anyOf('torque_wrenches'),
  '/imports/progress/:runId': NO_ROW,
  // Another patient's scan file (Wendell's digital impression): no share opens it.
  '/scan-files/:id': await anyOf('scan_files'),
  // The lab's signed link, not a session's route: a token that does not verify opens nothing.
  '/lab-files/:token': 'bm90LWEtdG9rZW4.bm90LWEtc2lnbmF0dXJl',
};

const ROUTES = apiRoutes
  .filter((r) => r.method === 'get')
  .map((r) => {
    const param = /^(.*?\/:\w+)/.exec(r.path)?.[1];
    if (!param) return { ...r, url: r.path, unfilled: null };
    const id = PARAM_IDS[param];
    return { ...r, url: id ? r.path.replace(/:\w+/, id) : r.path, unfilled: id ? null : param };
  });

/** Readiness routes: public, no record in them, and 503 is one of their documented answers. */
const READINESS = new Set(['/health', '/health/ready']);

/** Routes that answer with the signed-in user's own details, not the shared patient's record. */
const OWN_DETAILS = new Set(['/auth/me', '/practice/contact']);

/** What one reply may not hold; `chosen`: the share opens site 35 only, until today. */
function findLeaks(path: string, value: unknown, chosen: boolean, into: Set<string>, key = ''): void {
  const endsOn = chosen ? today : null;
  if (Array.isArray(value)) {
    for (const v of value) findLeaks(path, v, chosen, into, key);
    return;
  }
  if (typeof value === 'string') {
    if (chosen && (otherSites.includes(value) || otherSiteRecords.includes(value)))
      into.add(`${path}: ${key} names another site's row`);
    if (endsOn && DATED.test(key) && value.slice(0, 10) > endsOn)
      into.add(`${path}: ${key} ${value} after the share ended`);
    return;
  }
  if (!value || typeof value !== 'object') return;
  const row = value as Record<string, unknown>;
  for (const [k, v] of Object.entries(row)) {
    // The surgeon's own account and their own practice's contact are theirs to read (the sharing
    // practice's contact details would still be caught by FORBIDDEN_WORDS).
    if (FORBIDDEN_KEY.test(k) && !OWN_DETAILS.has(path)) into.add(`${path}: has ${key ? `${key}.` : ''}${k}`);
    // The signing clinician is named on the placement only.
    if (k === 'byName' && v !== null && row.kind !== 'placement')
      into.add(`${path}: ${JSON.stringify(row.kind)} names ${JSON.stringify(v)}`);
    if (k === 'id' && typeof v === 'string' && v === movedExam && endsOn)
      into.add(`${path}: serves the exam dated after the end`);
    findLeaks(path, v, chosen, into, k);
  }
}

async function surgeonWith(scopes: ('placement' | 'outcomes')[], chosenSites: boolean) {
  const account = await throwawayAccount(ctx, 'surgeon');
  await ctx.db.insert(patientShares).values({
    practiceId: dentist.practiceId,
    patientId: harold,
    sharedWithUserId: account.id,
    sharedByUserId: dentist.id,
    scopes,
    siteIds: chosenSites ? [site35] : null,
    endsOn: chosenSites ? today : null,
    reason: 'Replies test',
  });
  return signInAs(ctx, account.email);
}

describe('every reply a shared surgeon can get', () => {
  it('walks every GET route of the contracts, each with an id for its param', () => {
    expect(ROUTES.filter((r) => r.unfilled).map((r) => `${r.path}: add an id for ${r.unfilled}`)).toEqual([]);
    expect(ROUTES.length).toBe(apiRoutes.filter((r) => r.method === 'get').length);
    expect(FORBIDDEN_WORDS.length, 'the staff, the lab and the contact to look for').toBeGreaterThan(3);
    expect(otherSiteRecords.length, "records of Harold's other site to look for").toBeGreaterThan(3);
  });

  it.each([
    [['outcomes'], false],
    [['outcomes'], true],
    [['placement'], false],
    [['placement'], true],
    [['placement', 'outcomes'], false],
    [['placement', 'outcomes'], true],
  ] as const)('with %j (chosen sites, ending today: %s): nothing the share does not open', async (scopes, chosen) => {
    const cookie = await surgeonWith([...scopes], chosen);
    // The same scopes over every site: what a share of chosen sites is compared with.
    const everySite = chosen ? await surgeonWith([...scopes], false) : null;
    const leaks = new Set<string>();
    const served: string[] = [];
    for (const route of ROUTES) {
      const res = await ctx.http.get(`/api${route.url}`).set('Cookie', cookie).buffer(true).parse(replyBytes);
      // Readiness answers 503 by contract when object storage is slow (a loaded CI machine): not a fault.
      expect(READINESS.has(route.path) && res.status === 503 ? 200 : res.status, route.path).toBeLessThan(500);
      if (res.status !== 200) {
        const whole = everySite && (await ctx.http.get(`/api${route.url}`).set('Cookie', everySite)).status;
        if (res.status === 404 && whole === 200)
          leaks.add(
            `${route.path}: 404 for a share of chosen sites, 200 for all sites (filter the list, never refuse it)`,
          );
        continue;
      }
      served.push(route.path);
      if (route.path === '/lab-prescriptions/:id/pdf')
        leaks.add(`${route.path}: the lab prescription (the lab's address) is served`);
      const body = res.body as Buffer;
      const type = (res.headers['content-type'] as string | undefined) ?? '';
      const isJson = type.includes('json');
      const content = isJson || type.includes('csv') ? body.toString('utf8') : '';
      for (const word of FORBIDDEN_WORDS) if (content.includes(word)) leaks.add(`${route.path}: holds "${word}"`);
      if (isJson) findLeaks(route.path, JSON.parse(content) as unknown, chosen, leaks);
      else if (chosen)
        for (const id of otherSites) if (content.includes(id)) leaks.add(`${route.path}: names another site`);
    }
    expect(served.length, 'the surgeon reads the routes of the shared record').toBeGreaterThan(8);
    expect(served).toContain('/sites/:id/timeline');
    expect([...leaks]).toEqual([]);
  });
});
