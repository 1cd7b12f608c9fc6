// Least privilege in the replies (issue 12), checked in the JSON itself: every GET route of the
// contracts that reads a patient's record (found from packages/contracts/src/routes.ts, not
// hand-picked) is called by a surgeon whose share of Harold Whitcombe opens site 35 only, with
// each scope; no reply may carry his contact details or risk factors, nor anything of site 37.
import { apiRoutes } from '@torquetrail/contracts';
import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { patientShares } from '../src/db/schema/index.js';
import { signInAs, throwawayAccount } from './support/people.js';
import { patientId, signInAll, siteId, startTestApp } from './support/test-app.js';

const ctx = await startTestApp();
afterAll(() => ctx.close());
const cookies = await signInAll(ctx);
const harold = await patientId(ctx.db, 'LL-1001');
const site35 = await siteId(ctx.db, 'LL-1001', 35);
const site37 = await siteId(ctx.db, 'LL-1001', 37);
const [dentist] = await ctx.db
  .select({ id: patientShares.sharedByUserId, practiceId: patientShares.practiceId })
  .from(patientShares)
  .where(eq(patientShares.patientId, harold))
  .limit(1);

/** The records of Harold the routes' `:id` stand for, by the route's first segment. */
const asDentist = async (path: string) => (await ctx.http.get(path).set('Cookie', cookies.dentist)).body;
const restorations = (await asDentist(`/api/patients/${harold}/restorations`)) as { items?: { id: string }[] };
const radiographs = (await asDentist(`/api/patients/${harold}/radiographs`)) as { items?: { id: string }[] };
const ID_OF: Record<string, string | undefined> = {
  patients: harold,
  sites: site35,
  'recalls/patients': harold,
  'recalls/sites': site35,
  restorations: restorations.items?.[0]?.id,
  radiographs: radiographs.items?.[0]?.id,
};
/** Routes of the patient's record the surgeon could call: GETs with a patient-record id or a scoped list. */
const ROUTES = apiRoutes
  .filter((r) => r.method === 'get' && !r.produces)
  .flatMap((r) => {
    const prefix = /^\/(recalls\/patients|recalls\/sites|patients|sites|restorations|radiographs)\/:id/.exec(r.path);
    if (prefix) {
      const id = ID_OF[prefix[1]];
      return id ? [r.path.replace(':id', id)] : [];
    }
    return ['/patients', '/recalls/desk'].includes(r.path) ? [r.path] : [];
  });

/** What no reply to a shared surgeon may hold (keys anywhere in the JSON, or these values). */
const FORBIDDEN_KEYS = ['riskFactors', 'contact', 'phone', 'smoker', 'diabetesPoorlyControlled', 'missingTeeth', 'sex'];
const FORBIDDEN_VALUES = ['harold.whitcombe@mail.example', site37];

function keysOf(value: unknown, into = new Set<string>()): Set<string> {
  if (Array.isArray(value)) for (const v of value) keysOf(v, into);
  else if (value && typeof value === 'object')
    for (const [k, v] of Object.entries(value)) {
      into.add(k);
      keysOf(v, into);
    }
  return into;
}

async function surgeonWith(scopes: ('placement' | 'outcomes')[]) {
  const account = await throwawayAccount(ctx, 'surgeon');
  await ctx.db.insert(patientShares).values({
    practiceId: dentist.practiceId,
    patientId: harold,
    sharedWithUserId: account.id,
    sharedByUserId: dentist.id,
    scopes,
    siteIds: [site35],
    reason: 'Replies test',
  });
  return signInAs(ctx, account.email);
}

describe('the JSON a shared surgeon receives', () => {
  it('walks the patient routes of the contracts (the walk itself finds them)', () => {
    expect(ROUTES.length).toBeGreaterThanOrEqual(10);
    expect(ROUTES).toContain(`/sites/${site35}/timeline`);
  });

  it.each([[['outcomes']], [['placement']], [['placement', 'outcomes']]] as const)(
    'with %j on site 35 only: no contact, no risk factors, nothing of site 37',
    async (scopes) => {
      const cookie = await surgeonWith([...scopes]);
      const leaks: string[] = [];
      let read = 0;
      for (const path of ROUTES) {
        const res = await ctx.http.get(`/api${path}`).set('Cookie', cookie);
        expect(res.status, `${path}: ${JSON.stringify(res.body)}`).toBeLessThan(500);
        if (res.status !== 200) continue;
        read += 1;
        const keys = keysOf(res.body);
        for (const key of FORBIDDEN_KEYS) if (keys.has(key)) leaks.push(`${path} has ${key}`);
        const text = JSON.stringify(res.body);
        for (const value of FORBIDDEN_VALUES) if (text.includes(value)) leaks.push(`${path} holds ${value}`);
      }
      expect(read, 'the surgeon reads some of the routes').toBeGreaterThan(0);
      expect(leaks).toEqual([]);
    },
  );
});
