// Two API processes (node apps/api/dist/main.js) on two ports, with one database, one bucket and
// one signing secret, as behind a load balancer: a session from one works on the other, a file
// written through one is read through the other, a reminder run by both at once is sent once,
// and one amendment sent through both at once gives one 201 and one 409.
import { type ChildProcess, spawn } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { addCalendarDays } from '@torquetrail/domain';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDatabase, createPool, type Database } from '../src/db/database.js';
import { recalls, reminderLog } from '../src/db/schema/index.js';
import { DEMO_PASSWORD } from '../src/seed/demo-scenario.js';
import { report } from './faults/fault-harness.js';
import { caughtFor, until } from './support/recalls.js';
import { ACCOUNTS, patientId, resetDatabase, siteId, testEnv } from './support/test-app.js';

const repoRoot = path.resolve(import.meta.dirname, '../../..');

async function freePort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const { port } = server.address() as net.AddressInfo;
  await new Promise<void>((r) => server.close(() => r()));
  return port;
}

interface Instance {
  url: string;
  child: ChildProcess;
}

async function startInstance(): Promise<Instance> {
  const port = await freePort();
  const child = spawn(process.execPath, [path.join(repoRoot, 'apps/api/dist/main.js')], {
    env: { ...process.env, PORT: String(port), WEB_DIST: '', LOG_LEVEL: 'error' },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const url = `http://127.0.0.1:${port}`;
  await until(async () => (await fetch(`${url}/api/health/live`).catch(() => null))?.ok, 30_000, 200);
  return { url, child };
}

let pool: ReturnType<typeof createPool>;
let db: Database;
let a: Instance;
let b: Instance;

beforeAll(async () => {
  pool = createPool(testEnv().DATABASE_URL);
  db = createDatabase(pool);
  await resetDatabase(db);
  [a, b] = await Promise.all([startInstance(), startInstance()]);
}, 60_000);
afterAll(async () => {
  for (const i of [a, b]) {
    if (!i) continue;
    const exited = new Promise((r) => i.child.once('exit', r));
    i.child.kill('SIGTERM');
    await exited;
  }
  await pool.end();
});

async function signIn(on: Instance, who: keyof typeof ACCOUNTS): Promise<string> {
  const res = await fetch(`${on.url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: ACCOUNTS[who], password: DEMO_PASSWORD }),
  });
  const cookie = res.headers.getSetCookie().find((c) => c.startsWith('tt_session='));
  if (!cookie) throw new Error(`sign-in of ${who} on ${on.url} failed: ${res.status}`);
  return cookie.split(';')[0];
}

const call = async (on: Instance, cookie: string, method: string, url: string, body?: unknown) => {
  const res = await fetch(`${on.url}${url}`, {
    method,
    headers: { cookie, ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const type = res.headers.get('content-type') ?? '';
  return {
    status: res.status,
    body: type.includes('json') ? ((await res.json()) as Record<string, unknown>) : null,
    bytes: type.includes('pdf') ? Buffer.from(await res.arrayBuffer()) : null,
  };
};

describe('two API instances', () => {
  it('a session made on one works on the other', async () => {
    const cookie = await signIn(a, 'dentist');
    const [onA, onB] = await Promise.all([
      call(a, cookie, 'GET', '/api/patients'),
      call(b, cookie, 'GET', '/api/patients'),
    ]);
    expect([onA.status, onB.status]).toEqual([200, 200]);
    expect(onB.body).toEqual(onA.body);
  });

  it('a lab prescription written through one is read through the other', async () => {
    const cookie = await signIn(b, 'dentist');
    const patient = await patientId(db, 'LL-1001');
    const plans = await call(a, cookie, 'GET', `/api/patients/${patient}/restorations`);
    const planId = ((plans.body ?? {}).items as { id: string }[])[0].id;
    const made = await call(a, cookie, 'POST', `/api/restorations/${planId}/lab-prescriptions`, { revise: true });
    expect(made.status).toBe(201);
    const [fromA, fromB] = await Promise.all([
      call(a, cookie, 'GET', `/api/lab-prescriptions/${String(made.body?.id)}/pdf`),
      call(b, cookie, 'GET', `/api/lab-prescriptions/${String(made.body?.id)}/pdf`),
    ]);
    expect([fromA.status, fromB.status]).toEqual([200, 200]);
    expect(fromB.bytes?.length).toBe(made.body?.sizeBytes);
    expect(fromB.bytes?.equals(fromA.bytes!)).toBe(true);
  });

  it('a reminder scan run by both at once sends the reminder once', { timeout: 40_000 }, async () => {
    const cookie = await signIn(a, 'practice_admin');
    const harold = await patientId(db, 'LL-1001');
    const [{ dueOn }] = await db.select({ dueOn: recalls.dueOn }).from(recalls).where(eq(recalls.patientId, harold));
    const today = addCalendarDays(dueOn, -10);
    const runs = await Promise.all([a, b].map((i) => call(i, cookie, 'POST', '/api/recalls/reminders/run', { today })));
    expect(runs.map((r) => r.status)).toEqual([200, 200]);
    const sent = await until(async () => {
      const rows = await db.select().from(reminderLog).where(eq(reminderLog.patientId, harold));
      const mine = rows.filter((r) => r.recallDueOn === dueOn && r.kind === 'upcoming');
      return mine.length === 1 && mine[0].status === 'sent' ? mine[0] : null;
    }, 20_000);
    await new Promise((r) => setTimeout(r, 2000));
    const delivered = (await caughtFor(sent.id)).length;
    expect(delivered).toBe(1);
    report('two API instances, one reminder scan run on both', { 'mails expected': 1, 'mails delivered': delivered });
  });

  it('one amendment sent through both at once: one 201, one 409', async () => {
    const cookie = await signIn(a, 'dentist');
    const site = await siteId(db, 'LL-1004', 14);
    const made = await call(a, cookie, 'POST', '/api/complications', {
      siteId: site,
      kind: 'other',
      occurredOn: '2025-01-01',
    });
    expect(made.status).toBe(201);
    const amend = { kind: 'screw-loosening', occurredOn: '2025-01-01', amendmentReason: 'Wrong kind' };
    const results = await Promise.all(
      [a, b].map((i) => call(i, cookie, 'POST', `/api/complications/${String(made.body?.id)}/amendments`, amend)),
    );
    const statuses = results.map((r) => r.status).sort((x, y) => x - y);
    expect(statuses).toEqual([201, 409]);
    report('two API instances, one amendment through both at once', { answers: statuses.join(' and ') });
  });
});
