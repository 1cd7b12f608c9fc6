// Every route of the foundation, for each role of Larkspur Lane, the surgeon of Northgate (who
// is shared into four Larkspur patients) and a dentist of the unrelated Quarry Hill practice.
// Expectations follow the product brief's role table (see docs/authorization.md).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
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

beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await actorCookies(ctx);
  ids.whitcombe = await patientId(ctx.db, 'LL-1001'); // shared with the surgeon
  ids.okafor = await patientId(ctx.db, 'LL-1003'); // not shared
  ids.quarry = await patientId(ctx.db, 'QH-2001'); // another practice
  ids.whitcombe35 = await siteId(ctx.db, 'LL-1001', 35);
  ids.okafor46 = await siteId(ctx.db, 'LL-1003', 46);
  ids.quarry36 = await siteId(ctx.db, 'QH-2001', 36);
});
afterAll(() => ctx.close());

const matrix: RoleCase[] = [
  { route: 'GET /api/auth/me', path: () => '/api/auth/me', expect: all(200) },
  { route: 'GET /api/patients', path: () => '/api/patients', expect: all(200) },
  {
    route: 'GET /api/patients/:id (own practice, shared with the surgeon)',
    path: () => `/api/patients/${ids.whitcombe}`,
    expect: sharedRead(),
  },
  {
    route: 'GET /api/patients/:id (own practice, not shared)',
    path: () => `/api/patients/${ids.okafor}`,
    expect: unsharedRead(),
  },
  {
    route: 'GET /api/patients/:id (another practice)',
    path: () => `/api/patients/${ids.quarry}`,
    expect: otherPracticeRead(),
  },
  {
    route: 'GET /api/patients/:id (no such id)',
    path: () => '/api/patients/00000000-0000-4000-8000-000000000000',
    expect: all(404),
  },
  { route: 'GET /api/sites/:id (shared)', path: () => `/api/sites/${ids.whitcombe35}`, expect: sharedRead() },
  { route: 'GET /api/sites/:id (not shared)', path: () => `/api/sites/${ids.okafor46}`, expect: unsharedRead() },
  {
    route: 'GET /api/sites/:id (another practice)',
    path: () => `/api/sites/${ids.quarry36}`,
    expect: otherPracticeRead(),
  },
  { route: 'GET /api/sites/:id (not a uuid)', path: () => '/api/sites/36', expect: all(404) },
];

describeRoleMatrix(() => ctx, matrix);

describe('what each list holds', () => {
  const chartNumbers = async (who: AccountKey, search?: string) => {
    const res = await ctx.http
      .get('/api/patients')
      .query(search ? { search } : {})
      .set('Cookie', cookies[who]);
    expect(res.status).toBe(200);
    return (res.body.items as { chartNumber: string }[]).map((p) => p.chartNumber).sort();
  };

  it('Larkspur roles see the nine Larkspur patients and none of Quarry Hill', async () => {
    for (const who of ['dentist', 'hygienist', 'practice_admin'] as const) {
      expect(await chartNumbers(who)).toEqual([
        'LL-1001',
        'LL-1002',
        'LL-1003',
        'LL-1004',
        'LL-1005',
        'LL-1006',
        'LL-1007',
        'LL-1008',
        'LL-1009',
      ]);
    }
  });

  it('the surgeon sees exactly the four patients shared with him', async () => {
    expect(await chartNumbers('surgeon')).toEqual(['LL-1001', 'LL-1002', 'LL-1004', 'LL-1005']);
  });

  it('Quarry Hill sees only its own two patients', async () => {
    expect(await chartNumbers('otherPracticeDentist')).toEqual(['QH-2001', 'QH-2002']);
  });

  it('search matches name parts and chart numbers, case-insensitively, within the scope', async () => {
    expect(await chartNumbers('dentist', 'whit')).toEqual(['LL-1001']);
    expect(await chartNumbers('dentist', 'lucía ferraz')).toEqual(['LL-1004']);
    expect(await chartNumbers('dentist', 'll-1003')).toEqual(['LL-1003']);
    expect(await chartNumbers('dentist', 'Marsh')).toEqual([]);
    expect(await chartNumbers('dentist', '%')).toEqual([]);
  });

  it('rejects an over-long search with 400 naming the field', async () => {
    const res = await ctx.http
      .get('/api/patients')
      .query({ search: 'x'.repeat(101) })
      .set('Cookie', cookies.dentist);
    expect(res.status).toBe(400);
    expect(res.body.fields).toHaveProperty('search');
  });
});
