// The role matrix of the API tests: every listed route is called by every actor, and the
// status each one gets is written out in a table. The actors are the four roles of Larkspur
// Lane (practice A), the dentist of the unrelated Quarry Hill practice (practice B), the Northgate
// surgeon — shared into LL-1001, LL-1002, LL-1004 and LL-1005 but not LL-1003, so a case on a
// shared record and one on an unshared record cover the surgeon with and without a share — and a
// caller with no session. Expectations follow docs/authorization.md.
import type { Response } from 'supertest';
import { describe, expect, it } from 'vitest';
import { ACCOUNTS, type AccountKey, signInAll, type TestContext } from './test-app.js';

type Actor = AccountKey | 'anonymous';
/** Every demo account in the order of ACCOUNTS, then no session. */
const ACTORS: readonly Actor[] = [...(Object.keys(ACCOUNTS) as AccountKey[]), 'anonymous'];
/** The status each actor gets from one route. */
export type Expected = Record<Actor, number>;

/** `status` for every signed-in actor, 401 without a session, with the exceptions given. */
export const all = (status: number, over: Partial<Expected> = {}): Expected => ({
  dentist: status,
  hygienist: status,
  surgeon: status,
  practice_admin: status,
  otherPracticeDentist: status,
  anonymous: 401,
  ...over,
});
/** A read of a Larkspur record shared with the surgeon: Quarry Hill does not see it. */
export const sharedRead = (): Expected => all(200, { otherPracticeDentist: 404 });
/** A read of a Larkspur record not shared with the surgeon. */
export const unsharedRead = (): Expected => all(200, { surgeon: 404, otherPracticeDentist: 404 });
/** A read of a Quarry Hill record: only its own dentist sees it. */
export const otherPracticeRead = (): Expected => all(404, { otherPracticeDentist: 200 });

const sessions = new WeakMap<TestContext, Promise<Record<AccountKey, string>>>();

/**
 * Session cookies of every demo account, signed in through the real route once per test app
 * (so once per file): the matrix and the file's own fixtures share them, and the sign-in
 * throttle is not spent on repeated sign-ins.
 */
export function actorCookies(ctx: TestContext): Promise<Record<AccountKey, string>> {
  let cookies = sessions.get(ctx);
  if (!cookies) sessions.set(ctx, (cookies = signInAll(ctx)));
  return cookies;
}

export interface RoleCase {
  /** Method, route and which record, e.g. 'GET /api/sites/:id (not shared)'. */
  route: string;
  method?: 'get' | 'post' | 'put' | 'patch';
  /** Called once per actor, so a route that changes data can get a fresh target every time. */
  path: () => string | Promise<string>;
  /** Called once per actor, after `path`. */
  body?: () => object | Promise<object>;
  expect: Expected;
  /** Further checks of the reply, e.g. the content type of a document. */
  check?: (res: Response, actor: Actor) => void;
}

export interface RoleMatrixOptions {
  /**
   * What the message of every 404 must match: a refusal reads like a missing record, never like
   * a forbidden one. `null` leaves the message unchecked.
   */
  notFoundMessage?: RegExp | null;
}

/** One `describe` per case, one `it` per actor, each independent of the others' order. */
export function describeRoleMatrix(
  app: () => TestContext,
  cases: readonly RoleCase[],
  options: RoleMatrixOptions = {},
): void {
  const notFound = options.notFoundMessage === undefined ? /^No such|Validation failed/ : options.notFoundMessage;
  describe.each(cases)('$route', (row) => {
    it.each(ACTORS)('as %s', async (actor) => {
      const ctx = app();
      const path = await row.path();
      let req = ctx.http[row.method ?? 'get'](path);
      if (actor !== 'anonymous') req = req.set('Cookie', (await actorCookies(ctx))[actor]);
      const res = row.body ? await req.send(await row.body()) : await req;
      expect(res.status, JSON.stringify(res.body)).toBe(row.expect[actor]);
      // The status is asserted above; a 404 must also say "not found" in the product's words.
      // oxlint-disable-next-line vitest/no-conditional-expect
      if (notFound && res.status === 404) expect(res.body.message).toMatch(notFound);
      row.check?.(res, actor);
    });
  });
}
