// The routes the app really serves, read from the Express router Nest registered them on: tests
// that must cover every route take the list from here, so a new route cannot be left out.
import type { INestApplication } from '@nestjs/common';

interface Layer {
  route?: { path: string; methods: Record<string, boolean> };
}

/** "METHOD /api/path" of every route under /api (the OpenAPI viewer aside), sorted. */
export function servedRoutes(app: INestApplication): string[] {
  const express = app.getHttpAdapter().getInstance() as { router: { stack: Layer[] } };
  return express.router.stack
    .flatMap((l) => (l.route && typeof l.route.path === 'string' ? [l.route] : []))
    .filter((r) => r.path.startsWith('/api/') && !r.path.startsWith('/api/docs'))
    .flatMap((r) => Object.keys(r.methods).map((m) => `${m.toUpperCase()} ${r.path}`))
    .sort();
}
