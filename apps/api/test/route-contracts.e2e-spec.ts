// Every route the API actually serves is in the contracts' route list (and so in the OpenAPI
// document), and every listed route exists: the docs cannot drift from the code.
import { apiRoutes } from '@torquetrail/contracts';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());

interface Layer {
  route?: { path: string; methods: Record<string, boolean> };
}

describe('route list', () => {
  it('matches the routes Nest registered under /api (docs routes aside)', () => {
    const express = ctx.app.getHttpAdapter().getInstance() as { router: { stack: Layer[] } };
    const served = express.router.stack
      .filter(
        (l) =>
          l.route &&
          typeof l.route.path === 'string' &&
          l.route.path.startsWith('/api/') &&
          !l.route.path.startsWith('/api/docs'),
      )
      .flatMap((l) => Object.keys(l.route!.methods).map((m) => `${m.toUpperCase()} ${l.route!.path.slice(4)}`))
      .sort();
    const listed = apiRoutes.map((r) => `${r.method.toUpperCase()} ${r.path}`).sort();
    expect(served).toEqual(listed);
  });
});
