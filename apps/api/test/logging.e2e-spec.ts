// Structured logs: a request id in every line and in every error reply, and no patient data in
// any line (no bodies, no query strings, no cookies, no SQL parameters).
import { sql } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { INestApplication } from '@nestjs/common';
import { createApp } from '../src/app.js';
import { createDatabase, createPool } from '../src/db/database.js';
import { errorForLog } from '../src/logging/logger.js';
import { DEMO_PASSWORD } from '../src/seed/demo-scenario.js';
import { ACCOUNTS, resetDatabase, testEnv } from './support/test-app.js';

const lines: Record<string, unknown>[] = [];
const logStream = { write: (line: string) => void lines.push(JSON.parse(line) as Record<string, unknown>) };
let app: INestApplication;
let http: ReturnType<typeof request>;
let cookie: string;
const pool = createPool(testEnv().DATABASE_URL);
const db = createDatabase(pool);

beforeAll(async () => {
  await resetDatabase(db);
  app = await createApp({ ...testEnv(), LOG_LEVEL: 'debug' }, { logStream });
  http = request(app.getHttpServer());
  const res = await http.post('/api/auth/sign-in').send({ email: ACCOUNTS.dentist, password: DEMO_PASSWORD });
  cookie = (res.headers['set-cookie'] as unknown as string[])[0].split(';')[0];
});
afterAll(async () => {
  await app.close();
  await pool.end();
});

const logged = () => JSON.stringify(lines);

describe('request ids', () => {
  it('puts one id in the X-Request-Id header, the error reply and the request’s log line', async () => {
    const res = await http.get('/api/patients/00000000-0000-4000-8000-000000000000').set('Cookie', cookie);
    expect(res.status).toBe(404);
    const id = res.headers['x-request-id'];
    expect(id).toMatch(/^[0-9a-f-]{36}$/);
    expect(res.body.requestId).toBe(id);
    expect(
      lines.some(
        (l) =>
          (l.req as { id?: string } | undefined)?.id === id &&
          (l.res as { statusCode?: number } | undefined)?.statusCode === 404,
      ),
    ).toBe(true);
  });

  it('keeps a proxy’s plain X-Request-Id, and replaces one that is not a plain token', async () => {
    const kept = await http.get('/api/health/live').set('X-Request-Id', 'lb-7f3a9c21');
    expect(kept.headers['x-request-id']).toBe('lb-7f3a9c21');
    const replaced = await http.get('/api/health/live').set('X-Request-Id', '<script>alert(1)</script>');
    expect(replaced.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  });
});

describe('no patient data in the logs', () => {
  it('logs neither a search’s query string, a request body, nor the session cookie', async () => {
    lines.length = 0;
    await http.get('/api/patients?q=Achterberg').set('Cookie', cookie);
    await http.post('/api/complications').set('Cookie', cookie).send({
      siteId: 'not-a-uuid',
      kind: 'other',
      occurredOn: '2026-11-01',
      notes: 'Patient disclosed a private matter',
    });
    expect(lines.length).toBeGreaterThanOrEqual(2);
    expect(logged()).not.toContain('Achterberg');
    expect(logged()).not.toContain('private matter');
    expect(logged()).not.toContain(cookie.split('=')[1]);
  });

  it('logs a failed query by its kind and PostgreSQL code, never its parameters', async () => {
    const error = await db.execute(sql`select ${'Implant note of Wendell Achterberg'}::int`).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(Error);
    expect((error as Error).message).toContain('Wendell Achterberg'); // the raw error does carry it
    const entry = errorForLog(error);
    expect(JSON.stringify(entry)).not.toContain('Wendell');
    expect(entry).toMatchObject({
      type: 'DrizzleQueryError',
      pgCode: '22P02',
      message: 'database query failed (query and parameters withheld)',
    });
  });
});
