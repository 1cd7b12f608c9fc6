// Torque entries that protect the patient: a settling re-torque earlier than the settling time
// (about 10 min, Siamos et al. 2002) warns and is saved only once confirmed, with the confirmation
// stored; a wrench whose calibration is overdue under the practice's interval (default 12 months
// [common practice]) flags the entry; calibration dates in the future are refused and calibrations
// are a history.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { patientWithPart } from './support/ledger-fixtures.js';
import { signInAll, startTestApp, type AccountKey, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;
beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await signInAll(ctx);
});
afterAll(() => ctx.close());

const send = (who: AccountKey, method: 'post' | 'put', path: string, body: object) =>
  ctx.http[method](path).set('Cookie', cookies[who]).send(body);
const day = (monthsAgo: number, daysAgo = 0) => {
  const d = new Date();
  d.setUTCMonth(d.getUTCMonth() - monthsAgo);
  d.setUTCDate(d.getUTCDate() - daysAgo);
  return d.toISOString().slice(0, 10);
};

describe('a settling re-torque earlier than the settling time', () => {
  it('is refused with a plain warning until confirmed; the confirmation is stored', async () => {
    const { instanceId, siteId } = await patientWithPart(ctx, 'T-SETTLE1', 'Solvra CN 4.3', 'PSI');
    const seated = await send('dentist', 'post', '/api/torque-events', {
      componentInstanceId: instanceId,
      appliedNcm: 25,
      reason: 'initial-seating',
      performedAt: '2026-11-20T09:30:00.000Z',
    });
    expect(seated.status, JSON.stringify(seated.body)).toBe(201);
    const early = {
      componentInstanceId: instanceId,
      appliedNcm: 25,
      reason: 're-torque-after-settling',
      performedAt: '2026-11-20T09:31:00.000Z',
    };
    const warned = await send('dentist', 'post', '/api/torque-events', early);
    expect(warned.status).toBe(400);
    expect(warned.body.fields.confirmEarlySettling).toBe(
      'This re-torque after settling comes 1 minute after the seating, earlier than the about 10 minutes settling takes (Siamos et al. 2002). Confirm to record it anyway',
    );
    const confirmed = await send('dentist', 'post', '/api/torque-events', { ...early, confirmEarlySettling: true });
    expect(confirmed.status, JSON.stringify(confirmed.body)).toBe(201);
    expect(confirmed.body).toMatchObject({ reason: 're-torque-after-settling', earlySettlingConfirmed: true });
    // The Timeline says so beside the entry.
    const timeline = await ctx.http.get(`/api/sites/${siteId}/timeline`).set('Cookie', cookies.dentist);
    const entry = timeline.body.events.find((e: { id: string }) => e.id === confirmed.body.id);
    expect(entry).toMatchObject({ earlySettlingConfirmed: true });
    expect(entry.detail).toMatch(/early re-torque confirmed by the clinician/);
  });

  it('is saved without a word once the settling time has passed', async () => {
    const { instanceId } = await patientWithPart(ctx, 'T-SETTLE2', 'Solvra CN 4.3', 'PSI');
    await send('dentist', 'post', '/api/torque-events', {
      componentInstanceId: instanceId,
      appliedNcm: 25,
      reason: 'initial-seating',
      performedAt: '2026-11-20T09:30:00.000Z',
    });
    const later = await send('dentist', 'post', '/api/torque-events', {
      componentInstanceId: instanceId,
      appliedNcm: 25,
      reason: 're-torque-after-settling',
      performedAt: '2026-11-20T09:40:00.000Z',
    });
    expect(later.status, JSON.stringify(later.body)).toBe(201);
    expect(later.body.earlySettlingConfirmed).toBe(false);
  });
});

describe('wrench calibration', () => {
  it('flags a torque recorded with an overdue wrench under the practice interval; history kept; future refused', async () => {
    const wrench = await send('practice_admin', 'post', '/api/wrenches', {
      label: 'Test driver T-CAL',
      type: 'spring',
      lastCalibratedOn: day(5),
    });
    expect(wrench.status, JSON.stringify(wrench.body)).toBe(201);
    // Default 12 months [common practice]: five months after its calibration it is in date.
    expect(wrench.body).toMatchObject({ calibrationOverdue: false, calibrationDueOn: day(-7) });

    const { instanceId, siteId } = await patientWithPart(ctx, 'T-CAL1', 'Solvra CN 4.3', 'PSI');
    const log = (appliedNcm: number) =>
      send('dentist', 'post', '/api/torque-events', {
        componentInstanceId: instanceId,
        appliedNcm,
        reason: 're-torque-at-recall',
        wrenchId: wrench.body.id,
      });
    const inDate = await log(25);
    expect(inDate.status, JSON.stringify(inDate.body)).toBe(201);
    expect(inDate.body.wrenchCalibrationOverdue).toBe(false);

    // The practice sets 3 months: the same wrench is now overdue, and the next entry carries the flag.
    const interval = await send('practice_admin', 'put', '/api/practice/wrench-settings', {
      calibrationIntervalMonths: 3,
    });
    expect(interval.status, JSON.stringify(interval.body)).toBe(200);
    try {
      expect(
        (await send('dentist', 'put', '/api/practice/wrench-settings', { calibrationIntervalMonths: 6 })).status,
      ).toBe(403);
      const refusedInterval = await send('practice_admin', 'put', '/api/practice/wrench-settings', {
        calibrationIntervalMonths: 0,
      });
      expect(refusedInterval.status).toBe(400);
      expect(refusedInterval.body.fields.calibrationIntervalMonths).toBe('A whole number of months from 1 to 60');
      const list = await ctx.http.get('/api/wrenches').set('Cookie', cookies.dentist);
      expect(list.body.calibrationIntervalMonths).toBe(3);
      expect(list.body.items.find((w: { id: string }) => w.id === wrench.body.id)).toMatchObject({
        calibrationOverdue: true,
        calibrationDueOn: day(2),
      });
      const overdue = await log(25.5);
      expect(overdue.status, JSON.stringify(overdue.body)).toBe(201);
      expect(overdue.body).toMatchObject({ verdict: 'within', wrenchCalibrationOverdue: true });
      // The Stack's last torque and the Timeline carry the flag beside the verdict.
      const stack = await ctx.http.get(`/api/sites/${siteId}`).set('Cookie', cookies.dentist);
      expect(stack.body.parts[0].lastTorque).toMatchObject({ appliedNcm: 25.5, wrenchCalibrationOverdue: true });
      const timeline = await ctx.http.get(`/api/sites/${siteId}/timeline`).set('Cookie', cookies.dentist);
      const entry = timeline.body.events.find((e: { id: string }) => e.id === overdue.body.id);
      expect(entry).toMatchObject({ wrenchCalibrationOverdue: true });
      expect(entry.detail).toMatch(/wrench calibration overdue/);

      // A calibration in the future is refused; a new one joins the history and clears the flag.
      const future = await send('practice_admin', 'post', `/api/wrenches/${wrench.body.id}/calibrations`, {
        calibratedOn: day(-1),
      });
      expect(future.status).toBe(400);
      expect(future.body.fields.calibratedOn).toBe('A calibration date cannot be in the future');
      const recalibrated = await send('practice_admin', 'post', `/api/wrenches/${wrench.body.id}/calibrations`, {
        calibratedOn: day(0),
      });
      expect(recalibrated.status, JSON.stringify(recalibrated.body)).toBe(201);
      const history = await ctx.http.get(`/api/wrenches/${wrench.body.id}/calibrations`).set('Cookie', cookies.dentist);
      expect(history.body.items.map((c: { calibratedOn: string }) => c.calibratedOn)).toEqual([day(0), day(5)]);
      const after = await log(26);
      expect(after.body.wrenchCalibrationOverdue).toBe(false);
    } finally {
      await send('practice_admin', 'put', '/api/practice/wrench-settings', { calibrationIntervalMonths: 12 });
    }
  });
});
