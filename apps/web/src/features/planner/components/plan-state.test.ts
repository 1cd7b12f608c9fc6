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
  maxDivergenceDeg: null,
  retentionLabel: null,
  retentionN: null,
  tray: null,
  copingLevel: null,
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
    expect(toBody('pid', onMua, catalogue, sites).sites.map((s) => s.multiUnitAngleDeg)).toEqual([17, 17]);
  });

  it('a typed zero axis is a Finding and a message beside the axis, not a crash', () => {
    const state = bridge();
    state.sites[1] = { ...state.sites[1], axis: ['0', '0', '0'] };
    const { findings, invalid } = liveFindings(state, sites, catalogue);
    expect(findings.map((f) => [f.severity, f.fdi])).toEqual([['error', 16]]);
    expect(findings[0].message).toBe(
      'Site 16, implant axis: An axis of 0, 0, 0 has no direction; enter the implant axis. The rules cannot check the plan until it is corrected.',
    );
    expect(invalid).toEqual({ 'sites.1.axis': 'An axis of 0, 0, 0 has no direction; enter the implant axis' });
  });

  it('turns acknowledgement keys back into code and site', () => {
    expect(
      toBody('pid', bridge({ acknowledged: ['divergence-over-limit:', 'primary-tooth-position:55'] }), catalogue, sites)
        .acknowledgements,
    ).toEqual([
      { code: 'divergence-over-limit', fdi: null },
      { code: 'primary-tooth-position', fdi: 55 },
    ]);
  });
});

// Issue 15 §2: the Findings and the Save button agree. An input the rules cannot evaluate is an
// error Finding in words (never "no findings" beside a disabled Save); a partly typed axis is
// completed from the placement or reported.
describe('inputs the rules cannot evaluate are Findings', () => {
  const errors = (state: PlanState, on = sites) =>
    liveFindings(state, on, catalogue).findings.filter((f) => f.severity === 'error');
  it('a non-number in the restorative space', () => {
    const state = bridge();
    state.sites[0] = { ...state.sites[0], restorativeSpaceMm: '7,5mm' };
    const { findings, invalid } = liveFindings(state, sites, catalogue);
    expect(findings.map((f) => [f.severity, f.code, f.fdi])).toEqual([['error', 'input-not-a-number', 15]]);
    expect(findings[0].message).toMatch(/^Site 15: the restorative space “7,5mm” is not a number/);
    expect(invalid).toEqual({ 'sites.0.restorativeSpaceMm': 'Enter the space in millimetres, e.g. 7.5' });
  });
  it('a decimal comma is a number, hex and exponents are not', () => {
    const state = bridge();
    state.sites[0] = { ...state.sites[0], restorativeSpaceMm: ' 7,5 ' };
    expect(errors(state)).toEqual([]);
    expect(toBody('pid', state, catalogue, sites).sites[0].restorativeSpaceMm).toBe(7.5);
    for (const text of ['0x10', '1e3', '--2', '.']) {
      state.sites[0] = { ...state.sites[0], restorativeSpaceMm: text };
      expect(errors(state).map((f) => f.code)).toEqual(['input-not-a-number']);
    }
  });
  it('a non-number in an axis component', () => {
    const state = bridge();
    state.sites[1] = { ...state.sites[1], axis: ['0', 'up', '1'] };
    const { findings, invalid } = liveFindings(state, sites, catalogue);
    expect(findings.map((f) => f.code)).toEqual(['input-not-a-number']);
    expect(findings[0].message).toMatch(/^Site 16: the implant axis y “up” is not a number/);
    expect(invalid).toEqual({ 'sites.1.axis.1': 'Enter a number for y' });
  });
  it('a negative space is a Finding naming the field', () => {
    const state = bridge();
    state.sites[0] = { ...state.sites[0], restorativeSpaceMm: '-2' };
    expect(errors(state).map((f) => [f.fdi, f.message])).toEqual([
      [15, 'Site 15, restorative space (mm): Enter 0 or more. The rules cannot check the plan until it is corrected.'],
    ]);
  });
  it('a partly typed axis is completed from the placement axis its boxes show', () => {
    const state = bridge();
    // Site 16 is placed 30° off vertical; typing only z = 1 keeps its x and y from the placement.
    state.sites[1] = { ...state.sites[1], axis: ['', '', '1'] };
    const body = toBody('pid', state, catalogue, sites);
    expect(body.sites[1].axis?.map((v) => Math.round(v * 1000) / 1000)).toEqual([0.5, 0, 1]);
    expect(liveFindings(state, sites, catalogue).findings.map((f) => f.code)).toEqual(['divergence-over-limit']);
    // Typing x = 0 over it makes the implants parallel: the completion uses the typed part.
    state.sites[1] = { ...state.sites[1], axis: ['0', '', ''] };
    expect(liveFindings(state, sites, catalogue).findings).toEqual([]);
  });
  it('a partly typed axis with no placement axis to complete it is reported', () => {
    const unplaced = [site('a', 15, [0, 0, 1]), site('b', 16, null)];
    const state = bridge();
    state.sites[1] = { ...state.sites[1], axis: ['0.2', '', ''] };
    const { findings, invalid } = liveFindings(state, unplaced, catalogue);
    expect(findings.map((f) => [f.severity, f.code, f.fdi])).toEqual([['error', 'input-partial-axis', 16]]);
    expect(findings[0].message).toMatch(/has no y or z/);
    expect(invalid).toEqual({ 'sites.1.axis': 'Enter y and z too' });
  });
  it('any angle the catalogue states is credited: two 25° multi-units correct 30° of divergence (Jang 2011 limit)', () => {
    const mua25: CatalogueComponent = { ...mua17, id: 'm25', name: 'MUA 25', angleDeg: 25 };
    const parts = new Map([[mua25.id, mua25]]);
    const state = bridge({ retention: 'screw-to-multi-unit' });
    state.sites = state.sites.map((s) => ({ ...s, impressionCoping: 'multi-unit', multiUnitComponentId: 'm25' }));
    // 30° − (25° + 25°) → 0° residual; each implant is 30° from the other, so the angle is called for.
    expect(liveFindings(state, sites, parts).findings).toEqual([]);
    expect(toBody('pid', state, parts, sites).sites.map((s) => s.multiUnitAngleDeg)).toEqual([25, 25]);
  });
  it('a multi-unit whose catalogue states no angle is a warning at its site, judged straight', () => {
    const unstated: CatalogueComponent = { ...mua17, id: 'mx', name: 'MUA unstated', angleDeg: null };
    const parts = new Map([[unstated.id, unstated]]);
    const state = bridge({ retention: 'screw-to-multi-unit' });
    state.sites = state.sites.map((s) => ({ ...s, impressionCoping: 'multi-unit', multiUnitComponentId: 'mx' }));
    const { findings } = liveFindings(state, sites, parts);
    expect(findings.map((f) => [f.severity, f.code, f.fdi])).toEqual([
      ['warning', 'divergence-over-limit', undefined],
      ['warning', 'catalogue-multi-unit-angle-missing', 15],
      ['warning', 'catalogue-multi-unit-angle-missing', 16],
    ]);
    expect(findings[1].message).toMatch(/^Site 15: the catalogue does not state the angle of MUA unstated\./);
    expect(toBody('pid', state, parts, sites).sites.map((s) => s.multiUnitAngleDeg)).toEqual([null, null]);
  });
});
