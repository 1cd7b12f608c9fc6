// PostgreSQL stopped (pg_ctl stop -m fast) while the API is busy and while it is idle, then
// started again: the process lives on, every refused request is a 503 with a plain message (no
// 500, no false 401), every acknowledged write is in the database afterwards and no other, and
// the API answers again without a restart. An API started while the database is away serves
// 503 and starts its job queue once the database returns; the queue of the API that lived
// through the outage sends mail again.
import type { INestApplication } from '@nestjs/common';
import { eq, like } from 'drizzle-orm';
import { addCalendarDays } from '@torquetrail/domain';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../src/app.js';
import { complications, recalls, reminderLog } from '../../src/db/schema/index.js';
import { RemindersService } from '../../src/recalls/reminders.service.js';
import { caughtFor, until } from '../support/recalls.js';
import { JobsService } from '../../src/jobs/jobs.service.js';
import { patientId, signIn, siteId, startTestApp, testEnv, type TestContext } from '../support/test-app.js';
import { postgres, report } from './fault-harness.js';

const WRITES = 200;
const BATCH = 4;
const STOP_AT = 60;
const DOWN_FOR = 40;

let ctx: TestContext;
let cookie: string;
let site: string;
let pgctl: Awaited<ReturnType<typeof postgres>>;

beforeAll(async () => {
  pgctl = await postgres();
  ctx = await startTestApp();
  cookie = await signIn(ctx, 'dentist');
  site = await siteId(ctx.db, 'LL-1004', 14);
});
// Restarting PostgreSQL and closing the app (its job queue drains first) can take longer than the
// default 30 s on a loaded machine.
afterAll(async () => {
  await pgctl.startPostgres();
  await ctx.close();
}, 90_000);

describe('PostgreSQL away', () => {
  it(
    'busy and idle: 503 while away, no write lost or invented, answers again by itself; an API starts meanwhile',
    { timeout: 60_000 },
    async () => {
      const tag = `fault-run-${Date.now()}`;
      const statuses = new Map<number, number>();
      const acknowledged: string[] = [];
      const messages = new Set<string>();
      let late: INestApplication | null = null;
      let idle: { status: number; message: string } | null = null;
      let lateWhileAway: number[] = [];
      let faults = 0;
      try {
        const write = async (i: number) => {
          const res = await ctx.http
            .post('/api/complications')
            .set('Cookie', cookie)
            .send({ siteId: site, kind: 'other', occurredOn: '2025-01-01', notes: `${tag} #${i}` });
          statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
          if (res.status === 201) acknowledged.push(res.body.id as string);
          else messages.add(String(res.body.message));
        };
        // Batches of four concurrent writes; the database stops while one batch is in flight (busy).
        for (let i = 0; i < WRITES; i += BATCH) {
          const batch = Promise.all(Array.from({ length: BATCH }, (_, k) => write(i + k)));
          if (i === STOP_AT) {
            await new Promise((r) => setTimeout(r, 5));
            pgctl.stopPostgres();
            faults += 1;
          }
          await batch;
          if (i === STOP_AT) {
            // The pool is idle now: a signed-in read must not answer "Sign in to continue".
            const res = await ctx.http.get('/api/patients').set('Cookie', cookie);
            idle = { status: res.status, message: res.body.message };
            // An API started while the database is away starts, and answers 503.
            late = await createApp(testEnv(), { logger: false });
            lateWhileAway = [
              (await request(late.getHttpServer()).get('/api/patients').set('Cookie', cookie)).status,
              (await request(late.getHttpServer()).get('/api/health/live')).status,
            ];
          }
          if (i === STOP_AT + DOWN_FOR) await pgctl.startPostgres();
        }
      } finally {
        await pgctl.startPostgres();
      }
      const found = await ctx.db
        .select({ id: complications.id })
        .from(complications)
        .where(like(complications.notes, `${tag} #%`));

      expect(idle).toEqual({ status: 503, message: 'The database is not reachable; try again in a moment' });
      expect(lateWhileAway).toEqual([503, 200]);
      expect([...statuses.keys()].sort((a, b) => a - b)).toEqual([201, 503]);
      expect([...messages]).toEqual(['The database is not reachable; try again in a moment']);
      expect(found.map((r) => r.id).sort((a, b) => a.localeCompare(b))).toEqual(
        [...acknowledged].sort((a, b) => a.localeCompare(b)),
      );
      // Writes after the restart were acknowledged: it recovered without a restart of the API.
      expect(acknowledged.length).toBeGreaterThanOrEqual(WRITES - DOWN_FOR - BATCH);
      // The API started while the database was away gets its job queue once it is back.
      await late!.get(JobsService).whenRunning(30_000);
      expect((await request(late!.getHttpServer()).get('/api/patients').set('Cookie', cookie)).status).toBe(200);
      await late!.close();
      // The queue of the API that lived through the outage works again: a reminder queued now is sent.
      const harold = await patientId(ctx.db, 'LL-1001');
      const [{ dueOn }] = await ctx.db
        .select({ dueOn: recalls.dueOn })
        .from(recalls)
        .where(eq(recalls.patientId, harold));
      await ctx.app.get(RemindersService).scan(addCalendarDays(dueOn, -10));
      const reminder = await until(async () => {
        const rows = await ctx.db.select().from(reminderLog).where(eq(reminderLog.patientId, harold));
        return rows.find((r) => r.recallDueOn === dueOn && r.kind === 'upcoming' && r.status === 'sent');
      }, 20_000);
      expect(await caughtFor(reminder.id)).toHaveLength(1);

      report('PostgreSQL stopped and restarted during writes', {
        'faults injected': faults,
        'writes attempted': WRITES,
        'writes acknowledged (201)': acknowledged.length,
        'rows found afterwards': found.length,
        'answered 503': statuses.get(503) ?? 0,
        'answered 500 or 401': (statuses.get(500) ?? 0) + (statuses.get(401) ?? 0),
      });
    },
  );
});
