// The ability cache (src/authz/ability-cache.ts) keeps a session's CASL ability between requests:
// here a session whose ability is certainly cached (the same requests, again and again) meets a
// changed role and a revoked share, and its very next request follows the change.
import { afterAll, describe, expect, it } from 'vitest';
import { signInAs, throwawayAccount } from './support/people.js';
import { patientId, signInAll, siteId, startTestApp } from './support/test-app.js';

const ctx = await startTestApp();
afterAll(() => ctx.close());
const cookies = await signInAll(ctx);
const get = (path: string, cookie: string) => ctx.http.get(path).set('Cookie', cookie);

/** The statuses of `paths`, each asked `times` times in a row, so the ability of the session is cached. */
async function statusesOf(paths: string[], cookie: string, times = 3) {
  const out: number[] = [];
  for (let i = 0; i < times; i += 1) for (const path of paths) out.push((await get(path, cookie)).status);
  return [...new Set(out)];
}

describe('a cached ability never outlives what it was built from', () => {
  it('a changed role is honoured on the very next request of the same session', async () => {
    const person = await throwawayAccount(ctx, 'dentist');
    const cookie = await signInAs(ctx, person.email);
    // The patient's access trail: the dentist's, never the hygienist's.
    const trail = `/api/patients/${await patientId(ctx.db, 'LL-1001')}/audit`;
    expect(await statusesOf([trail], cookie)).toEqual([200]);

    const toHygienist = await ctx.http
      .put(`/api/people/${person.id}/role`)
      .set('Cookie', cookies.practice_admin)
      .send({ role: 'hygienist' });
    expect(toHygienist.status).toBe(200);
    expect((await get(trail, cookie)).status).toBe(403);
    expect((await get('/api/auth/me', cookie)).body.role).toBe('hygienist');

    const back = await ctx.http
      .put(`/api/people/${person.id}/role`)
      .set('Cookie', cookies.practice_admin)
      .send({ role: 'dentist' });
    expect(back.status).toBe(200);
    expect((await get(trail, cookie)).status).toBe(200);
  });

  it('a revoked share closes the shared site on the very next request of the same session', async () => {
    const surgeon = await throwawayAccount(ctx, 'surgeon');
    const cookie = await signInAs(ctx, surgeon.email);
    const patient = await patientId(ctx.db, 'LL-1001');
    const site = await siteId(ctx.db, 'LL-1001', 35);
    const created = await ctx.http
      .post(`/api/patients/${patient}/shares`)
      .set('Cookie', cookies.dentist)
      .send({
        surgeonEmail: surgeon.email,
        scopes: ['outcomes'],
        siteIds: [site],
        endsOn: null,
        reason: 'Follow-up of the implant at 35',
      });
    expect(created.status).toBe(201);
    const shared = [`/api/sites/${site}`, `/api/sites/${site}/timeline`, `/api/recalls/sites/${site}/exams`];
    expect(await statusesOf(shared, cookie)).toEqual([200]);

    const revoked = await ctx.http
      .post(`/api/shares/${created.body.id}/revoke`)
      .set('Cookie', cookies.dentist)
      .send({ reason: 'Follow-up done' });
    expect(revoked.status).toBe(200);
    expect(await statusesOf(shared, cookie, 1)).toEqual([404]);
  });
});
