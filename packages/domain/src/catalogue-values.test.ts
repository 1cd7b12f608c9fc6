import { describe, expect, it } from 'vitest';
import {
  CATALOGUE_VALUE_FINDING_CODES as C,
  catalogueValueFindings,
  catalogueValuesRead,
  type PartValues,
  type SiteParts,
} from './catalogue-values.js';
import { type RestorationPlan, validateRestorationPlan } from './restoration-plan.js';

// The rules read what the practice's catalogue states (the manufacturer's instructions for use rule);
// which rule reads which value and the severity of a missing one are decisions [common practice],
// recorded in docs/clinical-rules.md. The divergence limit the multi-unit angle serves is Jang HK et al.
// 2011, Int J Oral Maxillofac Implants 26:1011–1015 [pub].

const part = (kind: string, values: Partial<PartValues> = {}): PartValues => ({
  name: `Part ${kind}`,
  kind,
  angleDeg: null,
  engaging: null,
  // Impression copings are read for their level too (part-fit.test.ts); implant level unless a test says otherwise.
  copingLevel: kind === 'impression-coping' ? 'implant' : null,
  ...values,
});
const mua = (angleDeg: number | null) =>
  part('multi-unit-abutment', { name: 'Multi-unit X', angleDeg, engaging: false });
const rows = (plan: Parameters<typeof catalogueValueFindings>[0], sites: SiteParts[]) =>
  catalogueValueFindings(plan, sites).map((f) => [f.code, f.fdi, f.severity]);

describe('catalogueValuesRead — which catalogue value a plan rule reads, by part kind', () => {
  it('reads the angle of multi-units and angled abutments, whether a coping engages, nothing of screws', () => {
    expect(catalogueValuesRead('multi-unit-abutment')).toEqual(['angleDeg']);
    expect(catalogueValuesRead('abutment-angled')).toEqual(['angleDeg', 'engaging']);
    expect(catalogueValuesRead('abutment-stock')).toEqual(['engaging']);
    expect(catalogueValuesRead('impression-coping')).toEqual(['engaging', 'copingLevel']);
    expect(catalogueValuesRead('abutment-screw')).toEqual([]);
  });
});

describe('catalogueValueFindings — a chosen part lacking a value a rule needs is a Finding', () => {
  const onMua = { kind: 'splinted-bridge', retention: 'screw-to-multi-unit' } as const;

  it('no Finding when the catalogue states every value read', () => {
    expect(
      rows(onMua, [
        {
          fdi: 34,
          multiUnit: mua(0),
          impressionCoping: part('impression-coping', { engaging: false, copingLevel: 'multi-unit' }),
        },
        { fdi: 36, multiUnit: mua(17) },
      ]),
    ).toEqual([]);
  });

  it('multi-unit without a stated angle on a splinted plan: a warning, judged as straight (can only over-warn)', () => {
    const f = catalogueValueFindings(onMua, [
      { fdi: 34, multiUnit: mua(0) },
      { fdi: 36, multiUnit: mua(null) },
    ]);
    expect(f.map((x) => [x.code, x.fdi, x.severity])).toEqual([[C.MULTI_UNIT_ANGLE_MISSING, 36, 'warning']]);
    expect(f[0].message).toBe(
      'Site 36: the catalogue does not state the angle of Multi-unit X. The divergence check treats it as straight (0°), which can add a warning but never hide one; enter the angle in the catalogue.',
    );
  });

  it('a correction angle entered for a multi-unit whose catalogue states none: an error (it could hide a divergence)', () => {
    expect(rows(onMua, [{ fdi: 36, multiUnit: mua(null), enteredMultiUnitAngleDeg: 30 }])).toEqual([
      [C.MULTI_UNIT_ANGLE_MISSING, 36, 'error'],
    ]);
    // An entered 0° credits no correction: still only a warning.
    expect(rows(onMua, [{ fdi: 36, multiUnit: mua(null), enteredMultiUnitAngleDeg: 0 }])).toEqual([
      [C.MULTI_UNIT_ANGLE_MISSING, 36, 'warning'],
    ]);
  });

  it('the unstated angle is judged as straight: the divergence rule warns as with a 0° multi-unit (Jang 2011)', () => {
    const tilt = (deg: number): [number, number, number] => [
      Math.sin((deg * Math.PI) / 180),
      0,
      Math.cos((deg * Math.PI) / 180),
    ];
    // What the planner sends for a part without an angle: no multiUnitAngleDeg (treated as 0°).
    const plan: RestorationPlan = {
      ...onMua,
      sites: [
        { fdi: 34, interface: 'non-engaging', impressionCoping: 'multi-unit', axis: [0, 0, 1] },
        { fdi: 36, interface: 'non-engaging', impressionCoping: 'multi-unit', axis: tilt(25) },
      ],
    };
    expect(validateRestorationPlan(plan).map((f) => f.code)).toEqual(['divergence-over-limit']);
  });

  it('no rule reads the multi-unit angle of a single crown, nor a multi-unit chosen under another retention', () => {
    expect(
      rows({ kind: 'single-crown', retention: 'screw-to-multi-unit' }, [{ fdi: 36, multiUnit: mua(null) }]),
    ).toEqual([]);
    expect(
      rows({ kind: 'splinted-bridge', retention: 'screw-to-implant' }, [{ fdi: 36, multiUnit: mua(null) }]),
    ).toEqual([]);
  });

  it('angled abutment without a stated angle on an abutment-level plan: a warning; a stock abutment is not judged', () => {
    const cemented = { kind: 'splinted-bridge', retention: 'cement-on-abutment' } as const;
    expect(
      rows(cemented, [
        { fdi: 34, abutment: part('abutment-angled', { engaging: true }) },
        { fdi: 36, abutment: part('abutment-stock', { engaging: true }) },
      ]),
    ).toEqual([[C.ABUTMENT_ANGLE_MISSING, 34, 'warning']]);
    expect(rows(cemented, [{ fdi: 34, abutment: part('abutment-angled', { angleDeg: 15, engaging: true }) }])).toEqual(
      [],
    );
  });

  it('coping not stated engaging or not: an error where the hex position is needed, a warning elsewhere', () => {
    const coping = { impressionCoping: part('impression-coping', { name: 'Coping Y' }) };
    expect(rows({ kind: 'single-crown', retention: 'screw-to-implant' }, [{ fdi: 36, ...coping }])).toEqual([
      [C.COPING_ENGAGING_MISSING, 36, 'error'],
    ]);
    expect(rows({ kind: 'splinted-bridge', retention: 'lingual-set-screw' }, [{ fdi: 36, ...coping }])).toEqual([
      [C.COPING_ENGAGING_MISSING, 36, 'error'],
    ]);
    expect(rows({ kind: 'splinted-bridge', retention: 'screw-to-implant' }, [{ fdi: 36, ...coping }])).toEqual([
      [C.COPING_ENGAGING_MISSING, 36, 'warning'],
    ]);
    const muaCoping = { impressionCoping: part('impression-coping', { name: 'Coping Y', copingLevel: 'multi-unit' }) };
    expect(rows(onMua, [{ fdi: 36, ...muaCoping }])).toEqual([[C.COPING_ENGAGING_MISSING, 36, 'warning']]);
  });
});
