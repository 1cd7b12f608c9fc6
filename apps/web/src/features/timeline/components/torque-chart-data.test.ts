// The torque chart's band and spec line show what each reading was judged against, not the part's
// specification of today: a reading of 2019 judged against 35 N·cm ±10 % keeps that window after
// the catalogue moved the part to 30 N·cm.
import type { TorqueSeries } from '@torquetrail/contracts';
import { describe, expect, it } from 'vitest';
import { torqueChartPoints } from './torque-chart-data';

const point = (at: string, appliedNcm: number, specNcm: number, tolerancePct: number) => ({
  id: crypto.randomUUID(),
  at,
  appliedNcm,
  specNcm,
  tolerancePct,
  verdict: 'within' as const,
  reason: 'initial-seating' as const,
});

describe('torque chart points', () => {
  it('take band and spec from each stored reading, whatever the spec of today', () => {
    const series = {
      componentInstanceId: crypto.randomUUID(),
      label: 'Abutment screw',
      specNcm: 30,
      tolerancePct: 5,
      removedOn: null,
      points: [point('2019-05-02T10:00:00.000Z', 35, 35, 10), point('2024-03-01T10:00:00.000Z', 30, 30, 5)],
    } as TorqueSeries;
    const [old, recent] = torqueChartPoints(series);
    expect(old).toMatchObject({ spec: 35, applied: 35, t: Date.parse('2019-05-02T10:00:00.000Z') });
    expect(old.band[0]).toBeCloseTo(31.5);
    expect(old.band[1]).toBeCloseTo(38.5);
    expect(recent.spec).toBe(30);
    expect(recent.band[0]).toBeCloseTo(28.5);
    expect(recent.band[1]).toBeCloseTo(31.5);
  });
});
