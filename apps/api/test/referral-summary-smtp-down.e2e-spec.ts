// SMTP down: a referral summary mail is recorded, its send job fails and is retried with back-off;
// when SMTP is back (a second app instance with the good SMTP port, same database and queue) the
// retry delivers it, once.
import net from 'node:net';
import type { INestApplication } from '@nestjs/common';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../src/app.js';
import { patientShares, referralSummaryMails, users } from '../src/db/schema/index.js';
import { JobsService } from '../src/jobs/jobs.service.js';
import { ReferralSummaryService } from '../src/outcomes/referral-summary.service.js';
import { createDatabase, createPool, type Database } from '../src/db/database.js';
import { until } from './support/recalls.js';
import { ACCOUNTS, patientId, resetDatabase, testEnv } from './support/test-app.js';

process.env.REMINDER_RETRY_DELAY_S = '1';

async function closedPort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const { port } = server.address() as net.AddressInfo;
  await new Promise<void>((r) => server.close(() => r()));
  return port;
}
const mailHttp = `http://127.0.0.1:${process.env.TT_MAIL_HTTP_PORT ?? 2580}/messages`;
const caughtFor = async (id: string) =>
  ((await (await fetch(mailHttp)).json()) as { headers: Record<string, string> }[]).filter(
    (m) => m.headers['x-torquetrail-referral-summary'] === id,
  );

let pool: ReturnType<typeof createPool>;
let db: Database;
let down: INestApplication;
let downClosed = false;
let up: INestApplication | null = null;
beforeAll(async () => {
  pool = createPool(testEnv().DATABASE_URL);
  db = createDatabase(pool);
  await resetDatabase(db);
  down = await createApp({ ...testEnv(), SMTP_PORT: await closedPort() }, { logger: false });
});
afterAll(async () => {
  if (!downClosed) await down.close();
  await up?.close();
  await pool.end();
});

describe('a referral summary mail while SMTP is down', () => {
  it('fails, is recorded and retried; delivered once when SMTP is back', { timeout: 120_000 }, async () => {
    const harold = await patientId(db, 'LL-1001');
    const [share] = await db.select().from(patientShares).where(eq(patientShares.patientId, harold));
    const [dentist] = await db.select().from(users).where(eq(users.email, ACCOUNTS.dentist));
    const [made] = await db
      .insert(referralSummaryMails)
      .values({
        practiceId: share.practiceId,
        patientId: harold,
        shareId: share.id,
        sentTo: ACCOUNTS.surgeon,
        idempotencyKey: crypto.randomUUID(),
        requestedBy: dentist.id,
      })
      .returning();
    await down.get(JobsService).whenRunning(20_000);
    // The sweep finds the pending request and queues it, as after a request made while the queue was away.
    await down.get(ReferralSummaryService).sweep();
    const row = async () =>
      (await db.select().from(referralSummaryMails).where(eq(referralSummaryMails.id, made.id)))[0];
    const failed = await until(async () => {
      const r = await row();
      return r.attempts >= 2 ? r : null;
    }, 40_000);
    expect(failed).toMatchObject({ status: 'pending', messageId: null, sentAt: null });
    expect(failed.lastError).toMatch(/ECONNREFUSED|connect/i);
    expect(await caughtFor(made.id)).toEqual([]);

    await down.close();
    downClosed = true;
    up = await createApp(testEnv(), { logger: false });
    const sent = await until(async () => {
      const r = await row();
      return r.status === 'sent' ? r : null;
    }, 60_000);
    expect(sent.attempts).toBeGreaterThanOrEqual(3);
    const mail = await until(async () => ((await caughtFor(made.id)).length > 0 ? caughtFor(made.id) : null), 10_000);
    expect(mail).toHaveLength(1);
    expect(await up.get(ReferralSummaryService).deliver(made.id)).toBe('already-sent');
    await new Promise((r) => setTimeout(r, 1500));
    expect(await caughtFor(made.id)).toHaveLength(1);
  });
});
