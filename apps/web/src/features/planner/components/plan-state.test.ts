// The planner's live Findings are validateRestorationPlan's (docs/clinical-rules.md §8) on the
// form state, with each site's axis typed or taken from its placement.
import type { CatalogueComponent, RestorableSite } from '@torquetrail/contracts';
import { describe, expect, it } from 'vitest';
import { emptySitePlan, initialPlan, liveFindings, type PlanState, toBody } from './plan-state';

const site = (siteId: string, fdi: number, axis: [number, number, number] | null): RestorableSite => ({
  siteId,
  fdi,
  universal: '',
  status: 'placed',
  platformId: 'p',
  systemName: 'S',
  platformName: 'S 4.1',
  connection: 'external-hex',
  diameterMm: 4.1,
  axis,
});
const sites = [site('a', 15, [0, 0, 1]), site('b', 16, [Math.sin(Math.PI / 6), 0, Math.cos(Math.PI / 6)])];
const mua17: CatalogueComponent = {
  id: 'm17',
  platformId: 'p',
  kind: 'multi-unit-abutment',
  name: 'MUA 17',
  referenceCode: 'M17',
  engaging: true,
  angleDeg: 17,
  collarHeightMm: 2.5,
  tray: null,
  torqueSpecNcm: 15,
  tolerancePct: 10,
  requiresLot: true,
  inUse: false,
  version: 1,
  versionedAt: '2026-01-01T00:00:00.000Z',
};
const catalogue = new Map([[mua17.id, mua17]]);
const bridge = (over: Partial<PlanState> = {}): PlanState => ({
  ...initialPlan,
  sites: [emptySitePlan('a'), emptySitePlan('b')],
  ...over,
});

describe('planner state', () => {
  it('flags an engaging coping on a bridge screwed to the implants (common practice)', () => {
    const state = bridge();
    state.sites[0] = { ...state.sites[0], impressionCoping: 'engaging' };
    const parallel = [site('a', 15, [0, 0, 1]), site('b', 16, [0, 0, 1])];
    expect(liveFindings(state, parallel, catalogue).findings.map((f) => [f.severity, f.code, f.fdi])).toEqual([
      ['error', 'engaging-impression-for-platform-bridge', 15],
    ]);
  });

  it('uses the placement axes: 30° apart warns on a splinted bridge (limit 15°, Jang 2011) unless multi-units correct it', () => {
    expect(liveFindings(bridge(), sites, catalogue).findings.map((f) => f.code)).toEqual(['divergence-over-limit']);
    const onMua = bridge({ retention: 'screw-to-multi-unit' });
    onMua.sites = onMua.sites.map((s) => ({ ...s, impressionCoping: 'multi-unit', multiUnitComponentId: 'm17' }));
    // 30° − (17° + 17°) → 0° residual [decision of validateRestorationPlan].
    expect(liveFindings(onMua, sites, catalogue).findings).toEqual([]);
    expect(toBody('pid', onMua, catalogue).sites.map((s) => s.multiUnitAngleDeg)).toEqual([17, 17]);
  });

  it('a typed zero axis is a field message, not a crash', () => {
    const state = bridge();
    state.sites[1] = { ...state.sites[1], axis: ['0', '0', '0'] };
    const { findings, invalid } = liveFindings(state, sites, catalogue);
    expect(findings).toEqual([]);
    expect(Object.values(invalid)[0]).toBe('An axis of 0, 0, 0 has no direction; enter the implant axis');
  });

  it('turns acknowledgement keys back into code and site', () => {
    expect(
      toBody('pid', bridge({ acknowledged: ['divergence-over-limit:', 'primary-tooth-position:55'] }), catalogue)
        .acknowledgements,
    ).toEqual([
      { code: 'divergence-over-limit', fdi: null },
      { code: 'primary-tooth-position', fdi: 55 },
    ]);
  });
});
