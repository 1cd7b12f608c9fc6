import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { patientId, signIn, siteId, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let dentist: string;
beforeAll(async () => {
  ctx = await startTestApp();
  dentist = await signIn(ctx, 'dentist');
});
afterAll(() => ctx.close());

describe('the Arch data of a patient', () => {
  it('lists the implant sites with their status and system, and the missing teeth', async () => {
    const res = await ctx.http.get(`/api/patients/${await patientId(ctx.db, 'LL-1004')}`).set('Cookie', dentist);
    expect(res.status).toBe(200);
    expect(
      res.body.sites.map((s: { fdi: number; status: string; systemName: string | null }) => [
        s.fdi,
        s.status,
        s.systemName,
      ]),
    ).toEqual([
      [14, 'restored', 'Solvra CN'],
      [24, 'planned', null],
    ]);
    // 14 has the seeded recall history (healthy); the planned 24 has never been examined.
    expect(res.body.sites.map((s: { fdi: number; maintenanceStatus: string }) => [s.fdi, s.maintenanceStatus])).toEqual(
      [
        [14, 'health'],
        [24, 'not-examined'],
      ],
    );
  });
});

describe('the Site file', () => {
  it('shows the screw-retained bridge on non-engaging interfaces, with the last torque and its verdict', async () => {
    const res = await ctx.http.get(`/api/sites/${await siteId(ctx.db, 'LL-1001', 35)}`).set('Cookie', dentist);
    expect(res.status).toBe(200);
    expect(res.body.placement).toMatchObject({
      systemName: 'Solvra CN',
      diameterMm: 4.3,
      lengthMm: 10,
      connection: 'internal-conical',
      platformShift: true,
    });
    expect(res.body.restoration).toMatchObject({
      kind: 'splinted-bridge',
      retention: 'screw-to-implant',
      interface: 'non-engaging',
      retrievable: true,
      spansFdi: [35, 37],
    });
    expect(res.body.parts).toHaveLength(1);
    expect(res.body.parts[0]).toMatchObject({
      kind: 'prosthetic-screw',
      torqueSpecNcm: 25,
      lastTorque: { appliedNcm: 25, verdict: 'within', reason: 're-torque-at-recall' },
    });
  });

  it('flags a cement-retained crown as not retrievable', async () => {
    const res = await ctx.http.get(`/api/sites/${await siteId(ctx.db, 'LL-1003', 46)}`).set('Cookie', dentist);
    expect(res.body.restoration).toMatchObject({ retention: 'cement-on-abutment', retrievable: false });
    expect(res.body.parts.map((p: { kind: string }) => p.kind)).toEqual(['abutment-custom', 'abutment-screw']);
  });

  it('shows the 30° multi-unit abutment below its prosthetic screw, each with its own specification', async () => {
    const res = await ctx.http.get(`/api/sites/${await siteId(ctx.db, 'LL-1002', 45)}`).set('Cookie', dentist);
    const [mua, screw] = res.body.parts;
    expect(mua).toMatchObject({ kind: 'multi-unit-abutment', angleDeg: 30, torqueSpecNcm: 15 });
    // 14 N·cm against 15 ± 10 %: within (window 13.5–16.5).
    expect(screw).toMatchObject({
      kind: 'prosthetic-screw',
      torqueSpecNcm: 15,
      lastTorque: { appliedNcm: 14, verdict: 'within' },
    });
  });

  it('shows a planned site with no placement and an empty Stack', async () => {
    const res = await ctx.http.get(`/api/sites/${await siteId(ctx.db, 'LL-1004', 24)}`).set('Cookie', dentist);
    expect(res.body).toMatchObject({ fdi: 24, status: 'planned', placement: null, parts: [], restoration: null });
  });
});
