// SMTP down: the send job fails, is recorded and retried with back-off by pg-boss; when SMTP is
// back (a second app instance with the good SMTP port, same database and queue) the retry
// delivers it — once, and reminder_log keeps one row for the key.
import net from 'node:net';
import type { INestApplication } from '@nestjs/common';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../src/app.js';
import { recalls, reminderLog } from '../src/db/schema/index.js';
import { addCalendarDays as addDaysIso } from '@torquetrail/domain';
import { RemindersService } from '../src/recalls/reminders.service.js';
import { createDatabase, createPool, type Database } from '../src/db/database.js';
import { patientId, resetDatabase, testEnv } from './support/test-app.js';
import { caughtFor, until } from './support/recalls.js';

process.env.REMINDER_RETRY_DELAY_S = '1';

/** A loopback port nothing listens on (bound, then released). */
async function closedPort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const { port } = server.address() as net.AddressInfo;
  await new Promise<void>((r) => server.close(() => r()));
  return port;
}

let pool: ReturnType<typeof createPool>;
let db: Database;
let down: INestApplication;
let up: INestApplication | null = null;
let harold: string;
let dueOn: string;

beforeAll(async () => {
  pool = createPool(testEnv().DATABASE_URL);
  db = createDatabase(pool);
  await resetDatabase(db);
  down = await createApp({ ...testEnv(), SMTP_PORT: await closedPort() }, { logger: false });
  harold = await patientId(db, 'LL-1001');
  [{ dueOn }] = (await db.select({ dueOn: recalls.dueOn }).from(recalls).where(eq(recalls.patientId, harold))) as [
    { dueOn: string },
  ];
});
afterAll(async () => {
  if (!downClosed) await down.close();
  await up?.close();
  await pool.end();
});
let downClosed = false;

const row = async () =>
  (await db.select().from(reminderLog).where(eq(reminderLog.patientId, harold))).filter(
    (r) => r.recallDueOn === dueOn && r.kind === 'upcoming',
  );

describe('a reminder while SMTP is down', () => {
  it('fails, is recorded and retried; delivered once when SMTP is back', { timeout: 90_000 }, async () => {
    const scan = await down.get(RemindersService).scan(addDaysIso(dueOn, -10));
    expect(scan.logged).toBeGreaterThanOrEqual(1);

    // Two failed attempts recorded by the job (first try and one retry), nothing sent.
    const failed = await until(async () => (await row()).find((r) => r.attempts >= 2), 30_000);
    expect(failed).toMatchObject({ status: 'pending', messageId: null, sentAt: null });
    expect(failed.lastError).toMatch(/ECONNREFUSED|connect/i);
    expect(await caughtFor(failed.id)).toEqual([]);
    const jobs = await db.execute<{ state: string; retry_count: number }>(
      `select state, retry_count from pgboss.job where name = 'recall-reminder-send' and singleton_key = '${failed.idempotencyKey}'`,
    );
    expect(jobs.rows.length).toBe(1);
    expect(jobs.rows[0].retry_count).toBeGreaterThanOrEqual(1);

    // SMTP "comes back": this instance stops; another with the good SMTP port takes the queue over.
    await down.close();
    downClosed = true;
    up = await createApp(testEnv(), { logger: false });
    // A scan on the next day must not queue a second job for the key while the retry is pending.
    await up.get(RemindersService).scan(addDaysIso(dueOn, -9));

    const sent = await until(async () => (await row()).find((r) => r.status === 'sent'), 60_000);
    expect(sent.attempts).toBeGreaterThanOrEqual(3);
    const mail = await until(
      async () => ((await caughtFor(sent.id)).length > 0 ? caughtFor(sent.id) : undefined),
      10_000,
    );
    expect(mail).toHaveLength(1);
    // The due day in words (Intl's en-GB long form, an independent writer), as the reminder prints it.
    const long = new Date(`${dueOn}T00:00:00Z`).toLocaleDateString('en-GB', {
      day: 'numeric',
      month: 'long',
      year: 'numeric',
      timeZone: 'UTC',
    });
    expect(mail[0].text).toContain(long);
    expect(await row()).toHaveLength(1);

    // Retrying the delivered key does nothing.
    expect(await up.get(RemindersService).deliver(sent.id)).toBe('already-sent');
    await new Promise((r) => setTimeout(r, 2000));
    expect(await caughtFor(sent.id)).toHaveLength(1);
  });
});
