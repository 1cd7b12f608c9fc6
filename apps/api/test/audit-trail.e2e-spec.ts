// The audit trail of issue 11, case by case: a read, a list, a write, a refused write, an export,
// sign-in and sign-out each leave exactly the expected rows; a write that rolls back leaves no
// success row; the app's own database role can add to the trail but never change or erase it;
// and the Audit page's API filters, pages and exports it. (Every route's row is also checked, call
// by call, by the route × actor matrix: support/audit-expectations.ts.)
import { randomUUID } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { auditValues, runInAudit, reportChange, type AuditContext } from '../src/common/audit-context.js';
import { CSV_BATCH } from '../src/audit/audit.service.js';
import { auditedTransaction } from '../src/db/audited-transaction.js';
import { complications, users } from '../src/db/schema/index.js';
import { actorCookies } from './support/role-matrix.js';
import { scenarioTargets } from './support/scenario-targets.js';
import { ACCOUNTS, startTestApp } from './support/test-app.js';

const ctx = await startTestApp();
afterAll(() => ctx.close());
const cookies = await actorCookies(ctx);
const { ids, labPrescription, fresh } = await scenarioTargets(ctx, cookies);
const userId = async (email: string) =>
  (await ctx.db.select({ id: users.id }).from(users).where(eq(users.email, email)))[0].id;
const dentistId = await userId(ACCOUNTS.dentist);

interface AuditRow {
  action: string;
  outcome: string;
  http_status: number;
  user_id: string | null;
  role: string | null;
  practice_id: string | null;
  record_type: string | null;
  record_id: string | null;
  patient_id: string | null;
  route: string;
  query: Record<string, unknown> | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
  address: string | null;
  user_agent: string | null;
  xmin: string;
}

/** The audit rows one request left, found by its request id. */
async function rowsOf(requestId: string | undefined): Promise<AuditRow[]> {
  expect(requestId).toBeTruthy();
  const { rows } = await ctx.db.execute<AuditRow & Record<string, unknown>>(
    sql`select *, xmin::text as xmin from audit_events where request_id = ${requestId!}`,
  );
  return rows;
}
const complicationCount = async () => (await ctx.db.select({ id: complications.id }).from(complications)).length;

describe('what each request leaves in the audit trail', () => {
  it('a read writes one row naming the record, the patient, who, from where and with what', async () => {
    const res = await ctx.http
      .get(`/api/sites/${ids.harold35}`)
      .set('Cookie', cookies.dentist)
      .set('User-Agent', 'audit-test/1.0')
      // Without TRUST_PROXY the claimed address is not believed.
      .set('X-Forwarded-For', '203.0.113.9');
    expect(res.status).toBe(200);
    const rows = await rowsOf(res.headers['x-request-id']);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({
      action: 'read',
      outcome: 'allowed',
      http_status: 200,
      user_id: dentistId,
      role: 'dentist',
      record_type: 'ImplantSite',
      record_id: ids.harold35,
      patient_id: ids.harold,
      route: 'GET /sites/:id',
      user_agent: 'audit-test/1.0',
    });
    expect(rows[0].address).toMatch(/127\.0\.0\.1$/);
  });

  it('a list writes one row naming its query, not one per patient', async () => {
    const res = await ctx.http.get('/api/patients?search=Whit').set('Cookie', cookies.dentist);
    expect(res.status).toBe(200);
    expect(res.body.items.length).toBeGreaterThan(0);
    const rows = await rowsOf(res.headers['x-request-id']);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ action: 'read', patient_id: null, query: { search: 'Whit' } });
  });

  it('a write writes one row, with what it wrote, in the write’s own transaction', async () => {
    const res = await ctx.http
      .post('/api/complications')
      .set('Cookie', cookies.dentist)
      .send({ siteId: ids.harold35, kind: 'other', occurredOn: '2024-02-02', notes: 'audited' });
    expect(res.status).toBe(201);
    const rows = await rowsOf(res.headers['x-request-id']);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({
      action: 'create',
      outcome: 'allowed',
      http_status: 201,
      record_type: 'Complication',
      record_id: res.body.id,
      patient_id: ids.harold,
      after: { kind: 'other', notes: 'audited', siteId: ids.harold35 },
    });
    const { rows: written } = await ctx.db.execute<{ xmin: string }>(
      sql`select xmin::text as xmin from complications where id = ${res.body.id}`,
    );
    expect(written[0].xmin).toBe(rows[0].xmin);
  });

  // Found by the write fuzzer: jsonb refuses a lone surrogate's escape, which failed the write.
  it('a change with a lone surrogate in its text is saved and audited, the surrogate as U+FFFD', async () => {
    const [system] = (await ctx.http.get('/api/catalogue').set('Cookie', cookies.practice_admin)).body.systems;
    const res = await ctx.http
      .patch(`/api/catalogue/systems/${system.id}`)
      .set('Cookie', cookies.practice_admin)
      .send({ manufacturer: 'Odd\ud800 maker' });
    expect(res.status).toBe(200);
    const [row] = await rowsOf(res.headers['x-request-id']);
    expect(row).toMatchObject({ action: 'catalogue-change', after: { manufacturer: 'Odd\uFFFD maker' } });
  });

  it('an amendment keeps the state before and after', async () => {
    const id = await fresh.complication();
    const res = await ctx.http
      .post(`/api/complications/${id}/amendments`)
      .set('Cookie', cookies.dentist)
      .send({ kind: 'other', occurredOn: '2024-02-03', notes: 'corrected', amendmentReason: 'wrong day' });
    expect(res.status).toBe(201);
    const [row] = await rowsOf(res.headers['x-request-id']);
    expect(row).toMatchObject({ action: 'amend', record_id: res.body.id, patient_id: ids.harold });
    expect(row.before).toMatchObject({ id, patientId: ids.harold });
    expect(row.after).toMatchObject({ occurredOn: '2024-02-03', supersedesId: id, amendmentReason: 'wrong day' });
  });

  it('a refused write writes one refused row and changes nothing', async () => {
    const before = await complicationCount();
    const res = await ctx.http
      .post('/api/complications')
      .set('Cookie', cookies.hygienist)
      .send({ siteId: ids.harold35, kind: 'other', occurredOn: '2024-02-02' });
    expect(res.status).toBe(403);
    const rows = await rowsOf(res.headers['x-request-id']);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ action: 'create', outcome: 'refused', http_status: 403, role: 'hygienist' });
    expect(await complicationCount()).toBe(before);
  });

  it('a write refused inside its transaction leaves the refused row only', async () => {
    const plan = await fresh.plan();
    const res = await ctx.http
      .post(`/api/restorations/${plan}/delivery`)
      .set('Cookie', cookies.dentist)
      .send({ deliveredOn: '2026-11-30', parts: [{ siteId: ids.harold35, componentId: randomUUID(), lot: 'X' }] });
    expect(res.status).toBe(400);
    const rows = await rowsOf(res.headers['x-request-id']);
    expect(rows.map((r) => [r.action, r.outcome, r.http_status])).toEqual([['create', 'refused', 400]]);
  });

  it('a write whose transaction rolls back leaves no success row; one that commits leaves one', async () => {
    const [dentist] = await ctx.db.select().from(users).where(eq(users.id, dentistId));
    const context = (requestId: string): AuditContext => ({
      plan: { action: 'create', recordType: 'Complication', route: 'TEST', successStatus: 201, inTransaction: true },
      actor: { userId: dentist.id, role: dentist.role, practiceId: dentist.practiceId },
      address: null,
      userAgent: null,
      requestId,
      query: null,
      opened: [],
      change: null,
      written: false,
    });
    const values = {
      practiceId: dentist.practiceId,
      patientId: ids.harold,
      siteId: ids.harold35,
      kind: 'other' as const,
      occurredOn: '2024-03-03',
      recordedBy: dentist.id,
    };
    const write = (requestId: string, fail: boolean) =>
      runInAudit(context(requestId), () =>
        auditedTransaction(ctx.db, async (tx) => {
          const [row] = await tx.insert(complications).values(values).returning({ id: complications.id });
          reportChange({ type: 'Complication', id: row.id, patientId: ids.harold });
          if (fail) throw new Error('the write failed after its insert');
          return row.id;
        }),
      );
    const before = await complicationCount();
    const rolledBack = randomUUID();
    await expect(write(rolledBack, true)).rejects.toThrow('failed after its insert');
    expect(await rowsOf(rolledBack)).toEqual([]);
    expect(await complicationCount()).toBe(before);

    const committed = randomUUID();
    const id = await write(committed, false);
    expect((await rowsOf(committed)).map((r) => [r.outcome, r.record_id])).toEqual([['allowed', id]]);
    expect(auditValues(context(committed), 'allowed', 201).action).toBe('create');
  });

  it('each export writes one export row: recall CSV, lab prescription PDF, radiograph original', async () => {
    const radiograph = await fresh.radiograph();
    for (const [path, patient] of [
      ['/api/recalls/desk/csv', null],
      [`/api/lab-prescriptions/${labPrescription}/pdf`, ids.harold],
      [`/api/radiographs/${radiograph}/original`, ids.harold],
    ] as const) {
      const res = await ctx.http.get(path).set('Cookie', cookies.dentist);
      expect(res.status, path).toBe(200);
      const rows = await rowsOf(res.headers['x-request-id']);
      expect(
        rows.map((r) => [r.action, r.outcome, r.patient_id]),
        path,
      ).toEqual([['export', 'allowed', patient]]);
    }
  });

  // The second dentist of Larkspur: sign-out ends every session of its user, so not one the other tests use.
  it('sign-in, a failed sign-in and sign-out are recorded against the account', async () => {
    const email = 'tomasz.brill@larkspur.example';
    const tomasz = await userId(email);
    const ok = await ctx.http.post('/api/auth/sign-in').send({ email, password: 'ledger-demo-2026' });
    expect(ok.status).toBe(200);
    expect(await rowsOf(ok.headers['x-request-id'])).toMatchObject([
      { action: 'sign-in', outcome: 'allowed', user_id: tomasz, role: 'dentist' },
    ]);
    const bad = await ctx.http.post('/api/auth/sign-in').send({ email, password: 'not the one' });
    expect(bad.status).toBe(401);
    expect(await rowsOf(bad.headers['x-request-id'])).toMatchObject([
      { action: 'sign-in-failed', outcome: 'refused', http_status: 401, user_id: tomasz },
    ]);
    const cookie = ([] as string[]).concat(ok.headers['set-cookie'] ?? [])[0].split(';')[0];
    const out = await ctx.http.post('/api/auth/sign-out').set('Cookie', cookie);
    expect(out.status).toBe(204);
    expect(await rowsOf(out.headers['x-request-id'])).toMatchObject([{ action: 'sign-out', user_id: tomasz }]);
  });
});

describe('append-only', () => {
  it('the app’s database role may add rows but not change or erase them', async () => {
    const { rows } = await ctx.db.execute<{ who: string }>(sql`select current_user as who`);
    expect(rows[0].who).toBe('torquetrail_app');
    // drizzle wraps the driver's error; PostgreSQL's own message is its cause.
    const refusal = (statement: ReturnType<typeof sql>) =>
      ctx.db.execute(statement).then(
        () => 'allowed',
        (error: Error) => (error.cause as Error | undefined)?.message ?? error.message,
      );
    expect(await refusal(sql`update audit_events set outcome = 'allowed'`)).toMatch(/permission denied/);
    expect(await refusal(sql`delete from audit_events`)).toMatch(/permission denied/);
    expect(await refusal(sql`truncate audit_events`)).toMatch(/permission denied/);
    await ctx.db.execute(sql`insert into audit_events (action, outcome) values ('read', 'refused')`);
  });
});

describe('the Audit page and "who accessed this record"', () => {
  it('filters by patient, user, action and dates, pages by keyset, and shows a read made earlier', async () => {
    const read = await ctx.http.get(`/api/patients/${ids.lucia}`).set('Cookie', cookies.hygienist);
    expect(read.status).toBe(200);
    const hygienistId = await userId(ACCOUNTS.hygienist);
    const page = await ctx.http
      .get(`/api/audit?patientId=${ids.lucia}&userId=${hygienistId}&action=read`)
      .set('Cookie', cookies.practice_admin);
    expect(page.status).toBe(200);
    expect(page.body.items[0]).toMatchObject({
      action: 'read',
      patientId: ids.lucia,
      userId: hygienistId,
      userName: expect.any(String),
      chartNumber: 'LL-1004',
      route: 'GET /patients/:id',
    });
    for (const item of page.body.items) expect(item).toMatchObject({ patientId: ids.lucia, userId: hygienistId });

    const future = await ctx.http.get('/api/audit?from=2099-01-01').set('Cookie', cookies.practice_admin);
    expect(future.body.items).toEqual([]);

    const first = await ctx.http.get('/api/audit?pageSize=3').set('Cookie', cookies.practice_admin);
    expect(first.body.items).toHaveLength(3);
    const second = await ctx.http
      .get(`/api/audit?pageSize=3&before=${first.body.nextBefore}`)
      .set('Cookie', cookies.practice_admin);
    const both = [...first.body.items, ...second.body.items];
    expect(new Set(both.map((i: { id: string }) => i.id)).size).toBe(both.length);
    const times = both.map((i: { at: string }) => i.at);
    expect([...times].sort().reverse()).toEqual(times);
  });

  it('the CSV export defuses formulas and is itself audited', async () => {
    const trap = await ctx.http
      .get(`/api/patients/${ids.harold}`)
      .set('Cookie', cookies.dentist)
      .set('User-Agent', '=HYPERLINK("http://example.invalid")');
    expect(trap.status).toBe(200);
    const csv = await ctx.http.get(`/api/audit/csv?patientId=${ids.harold}`).set('Cookie', cookies.practice_admin);
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/^text\/csv/);
    expect(csv.text.split('\r\n')[0]).toMatch(/^at \(UTC\),action,outcome/);
    expect(csv.text).toContain(`"'=HYPERLINK(""http://example.invalid"")"`);
    expect(await rowsOf(csv.headers['x-request-id'])).toMatchObject([
      { action: 'export', outcome: 'allowed', query: { patientId: ids.harold } },
    ]);
  });

  it('the CSV export carries every row of a trail longer than one batch, once, newest first', async () => {
    // Rows of an action no request in this file makes, so the filter selects exactly these.
    const [{ id: practiceId }] = await ctx.db
      .select({ id: users.practiceId })
      .from(users)
      .where(eq(users.id, dentistId));
    const count = CSV_BATCH * 2 + 7;
    await ctx.db.execute(sql`
      insert into audit_events (at, practice_id, user_id, role, action, outcome, route, record_type)
      select timestamptz '2026-01-01T00:00:00Z' + make_interval(secs => n), ${practiceId}, ${dentistId}, 'dentist',
             'sign-out', 'allowed', 'batch-' || n, 'session'
        from generate_series(1, ${count}) as n`);
    const csv = await ctx.http
      .get('/api/audit/csv?action=sign-out&from=2026-01-01&to=2026-01-02')
      .set('Cookie', cookies.practice_admin);
    expect(csv.status).toBe(200);
    const routes = csv.text
      .split('\r\n')
      .map((line) => /,batch-(\d+),/.exec(line)?.[1])
      .filter((n): n is string => n !== undefined)
      .map(Number);
    expect(routes).toEqual(Array.from({ length: count }, (_, i) => count - i));
  });

  it("gives the dentist a patient's rows, never another patient's or practice's", async () => {
    const res = await ctx.http.get(`/api/patients/${ids.wendell}/audit`).set('Cookie', cookies.dentist);
    expect(res.status).toBe(200);
    for (const item of res.body.items) expect(item.patientId).toBe(ids.wendell);
    expect((await ctx.http.get(`/api/patients/${ids.wendell}/audit`).set('Cookie', cookies.hygienist)).status).toBe(
      403,
    );
    expect(
      (await ctx.http.get(`/api/patients/${ids.wendell}/audit`).set('Cookie', cookies.otherPracticeDentist)).status,
    ).toBe(404);
    expect((await ctx.http.get('/api/audit').set('Cookie', cookies.dentist)).status).toBe(403);
  });
});
