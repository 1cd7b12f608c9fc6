import { describe, it, expect } from 'vitest';
import { PLAN_FINDING_CODES as C, PLAN_SOURCES } from './plan-findings.js';
import { RETENTIONS } from './choices.js';
import {
  isRetrievable,
  restorativeDesignForPlan,
  validateRestorationPlan,
  type RestorationPlan,
  type RestorationPlanSite,
} from './restoration-plan.js';
import { ValidationError } from './errors.js';

// Connection and impression rules: [common practice]. Divergence: Jang HK et al. 2011,
// Int J Oral Maxillofac Implants 26:1011–1015 [pub]. Space: Carpentieri 2019, JADA 150(8):695–706 [pub].

const s = (fdi: number, extra: Partial<RestorationPlanSite> = {}): RestorationPlanSite => ({
  fdi,
  interface: 'non-engaging',
  impressionCoping: 'non-engaging',
  ...extra,
});
const codes = (plan: RestorationPlan) => validateRestorationPlan(plan).map((f) => f.code);
const tilt = (deg: number): [number, number, number] => [
  Math.sin((deg * Math.PI) / 180),
  0,
  Math.cos((deg * Math.PI) / 180),
];

const validSingle: RestorationPlan = {
  kind: 'single-crown',
  retention: 'screw-to-implant',
  sites: [s(36, { interface: 'engaging', impressionCoping: 'engaging', restorativeSpaceMm: 6 })],
};
const validBridge: RestorationPlan = {
  kind: 'splinted-bridge',
  retention: 'screw-to-implant',
  sites: [s(34, { axis: [0, 0, 1] }), s(36, { axis: tilt(10) })],
};
const validFullArch: RestorationPlan = {
  kind: 'full-arch',
  retention: 'screw-to-multi-unit',
  sites: [32, 34, 42, 44].map((fdi, i) =>
    s(fdi, {
      impressionCoping: 'multi-unit',
      multiUnitAngleDeg: i % 2 === 0 ? 0 : 30,
      axis: i % 2 === 0 ? [0, 0, 1] : tilt(i === 1 ? -30 : 30),
      restorativeSpaceMm: 16,
    }),
  ),
};

describe('valid plans return []', () => {
  it.each([
    ['single screw-retained crown', validSingle],
    ['two-implant platform-level bridge', validBridge],
    ['full arch on four multi-units with 30° distal abutments', validFullArch],
    [
      'cemented single crown',
      {
        kind: 'single-crown',
        retention: 'cement-on-abutment',
        sites: [s(11, { interface: 'engaging', impressionCoping: 'engaging', restorativeSpaceMm: 8 })],
      },
    ],
    [
      'lingual-set-screw bridge',
      {
        kind: 'splinted-bridge',
        retention: 'lingual-set-screw',
        sites: [
          s(14, { interface: 'engaging', impressionCoping: 'engaging' }),
          s(16, { interface: 'engaging', impressionCoping: 'engaging' }),
        ],
      },
    ],
  ] as [string, RestorationPlan][])('%s', (_n, plan) => expect(validateRestorationPlan(plan)).toEqual([]));
});

describe('connection rules [common practice]', () => {
  it('engaging-interface-on-splinted: splinted screw-to-implant with an engaging interface (error, per site)', () => {
    const f = validateRestorationPlan({ ...validBridge, sites: [s(34, { interface: 'engaging' }), s(36)] });
    expect(f).toHaveLength(1);
    expect(f[0]).toMatchObject({
      severity: 'error',
      code: C.ENGAGING_INTERFACE_ON_SPLINTED,
      fdi: 34,
      source: PLAN_SOURCES.COMMON_PRACTICE,
    });
  });
  it('engaging interface is fine on a cemented bridge (abutments seat one by one)', () => {
    const plan: RestorationPlan = {
      kind: 'splinted-bridge',
      retention: 'cement-on-abutment',
      sites: [
        s(14, { interface: 'engaging', impressionCoping: 'engaging' }),
        s(16, { interface: 'engaging', impressionCoping: 'engaging' }),
      ],
    };
    expect(validateRestorationPlan(plan)).toEqual([]);
  });
  it('non-engaging-single-crown (error) — for every retention', () => {
    for (const retention of ['screw-to-implant', 'cement-on-abutment', 'lingual-set-screw'] as const) {
      const f = validateRestorationPlan({
        kind: 'single-crown',
        retention,
        sites: [s(21, { impressionCoping: 'engaging' })],
      });
      expect(f.map((x) => x.code)).toEqual([C.NON_ENGAGING_SINGLE_CROWN]);
      expect(f[0].fdi).toBe(21);
      expect(f[0].severity).toBe('error');
    }
  });
});

describe('impression rules [common practice]', () => {
  it('engaging-impression-for-platform-bridge (error)', () => {
    const f = validateRestorationPlan({ ...validBridge, sites: [s(34, { impressionCoping: 'engaging' }), s(36)] });
    expect(f.map((x) => [x.code, x.fdi, x.severity])).toEqual([
      [C.ENGAGING_IMPRESSION_FOR_PLATFORM_BRIDGE, 34, 'error'],
    ]);
  });
  it('non-engaging-impression-for-indexed: cement-on-abutment and lingual-set-screw need an engaging impression (error)', () => {
    for (const retention of ['cement-on-abutment', 'lingual-set-screw'] as const) {
      const f = validateRestorationPlan({ kind: 'single-crown', retention, sites: [s(21, { interface: 'engaging' })] });
      expect(f.map((x) => [x.code, x.fdi])).toEqual([[C.NON_ENGAGING_IMPRESSION_FOR_INDEXED, 21]]);
    }
  });
  it('non-engaging-impression-for-indexed also for a single screw-retained crown (the hex must be transferred)', () => {
    expect(codes({ ...validSingle, sites: [s(36, { interface: 'engaging' })] })).toEqual([
      C.NON_ENGAGING_IMPRESSION_FOR_INDEXED,
    ]);
  });
  it('multi-unit-impression-required: screw-to-multi-unit takes multi-unit copings (error)', () => {
    const plan: RestorationPlan = {
      ...validFullArch,
      sites: validFullArch.sites.map((x, i) => (i === 0 ? { ...x, impressionCoping: 'non-engaging' } : x)),
    };
    const f = validateRestorationPlan(plan);
    expect(f.map((x) => [x.code, x.fdi, x.severity])).toEqual([[C.MULTI_UNIT_IMPRESSION_REQUIRED, 32, 'error']]);
  });
  it('multi-unit coping without multi-unit abutments (error) and a multi-unit angle without them (warning)', () => {
    const f = validateRestorationPlan({
      ...validBridge,
      sites: [s(34, { impressionCoping: 'multi-unit', multiUnitAngleDeg: 17 }), s(36)],
    });
    expect(f.map((x) => [x.code, x.severity])).toEqual([
      [C.MULTI_UNIT_IMPRESSION_WITHOUT_ABUTMENT, 'error'],
      [C.MULTI_UNIT_ANGLE_WITHOUT_ABUTMENT, 'warning'],
    ]);
  });
  it('splinted-engaging-copings: engaging copings splinted together (warning, no single fdi)', () => {
    const plan: RestorationPlan = {
      kind: 'splinted-bridge',
      retention: 'cement-on-abutment',
      copingsSplinted: true,
      sites: [
        s(14, { interface: 'engaging', impressionCoping: 'engaging' }),
        s(16, { interface: 'engaging', impressionCoping: 'engaging' }),
      ],
    };
    const f = validateRestorationPlan(plan);
    expect(f).toHaveLength(1);
    expect(f[0]).toMatchObject({ severity: 'warning', code: C.SPLINTED_ENGAGING_COPINGS });
    expect(f[0].fdi).toBeUndefined();
    expect(f[0].message).toContain('14, 16');
  });
  it('non-engaging copings may be splinted', () => {
    expect(validateRestorationPlan({ ...validBridge, copingsSplinted: true })).toEqual([]);
  });
});

describe('divergence-over-limit — Jang HK et al. 2011 [pub]: accurate below about 15°', () => {
  const bridge = (deg: number): RestorationPlan => ({
    ...validBridge,
    sites: [s(34, { axis: [0, 0, 1] }), s(36, { axis: tilt(deg) })],
  });
  it('15° exactly → no warning ("more than 15°")', () => expect(codes(bridge(15))).toEqual([]));
  it('15.5° → warning naming both implants and the source', () => {
    const f = validateRestorationPlan(bridge(15.5));
    expect(f).toHaveLength(1);
    expect(f[0]).toMatchObject({ severity: 'warning', code: C.DIVERGENCE_OVER_LIMIT, source: PLAN_SOURCES.JANG_2011 });
    expect(f[0].message).toMatch(/34 and 36 diverge by 15\.5°/);
  });
  it('every pair is checked: 34 vs 45 can diverge while neighbours do not', () => {
    const plan: RestorationPlan = {
      ...validBridge,
      sites: [s(34, { axis: tilt(-9) }), s(35, { axis: [0, 0, 1] }), s(36, { axis: tilt(9) })],
    };
    const f = validateRestorationPlan(plan);
    expect(f).toHaveLength(1);
    expect(f[0].message).toMatch(/34 and 36/);
  });
  it('sites without an axis are skipped', () => {
    expect(codes({ ...validBridge, sites: [s(34, { axis: [0, 0, 1] }), s(36)] })).toEqual([]);
  });
  it('not checked on a single crown', () => {
    expect(codes({ ...validSingle, sites: [{ ...validSingle.sites[0], axis: tilt(40) }] })).toEqual([]);
  });
  it('angled multi-units correct it [decision]: residual = divergence − (angle a + angle b)', () => {
    const mua = (deg: number, a: number, b: number): RestorationPlan => ({
      kind: 'splinted-bridge',
      retention: 'screw-to-multi-unit',
      sites: [
        s(34, { impressionCoping: 'multi-unit', axis: [0, 0, 1], multiUnitAngleDeg: a }),
        s(36, { impressionCoping: 'multi-unit', axis: tilt(deg), multiUnitAngleDeg: b }),
      ],
    });
    expect(codes(mua(40, 0, 30))).toEqual([]); // residual 10°
    expect(codes(mua(32, 0, 17))).toEqual([]); // residual 15°
    expect(codes(mua(33, 0, 17))).toEqual([C.DIVERGENCE_OVER_LIMIT]); // residual 16°
    expect(codes(mua(50, 17, 17))).toEqual([C.DIVERGENCE_OVER_LIMIT]); // residual 16°
    expect(codes(mua(20, 0, 0))).toEqual([C.DIVERGENCE_OVER_LIMIT]); // straight multi-units do not correct
    expect(validateRestorationPlan(mua(50, 0, 30))[0].message).toMatch(/20° remain/);
    // Any angle the catalogue states is credited, not only 17° and 30° (catalogue-values.ts).
    expect(codes(mua(37, 0, 22.5))).toEqual([]); // residual 14.5°
    expect(codes(mua(38.5, 0, 22.5))).toEqual([C.DIVERGENCE_OVER_LIMIT]); // residual 16°
  });
  it('no correction without multi-unit retention', () => {
    expect(codes(bridge(20))).toEqual([C.DIVERGENCE_OVER_LIMIT]);
  });
});

describe('angled-multi-unit-not-needed — Jang HK et al. 2011 [pub] limit; angle correction [common practice]', () => {
  const onMua = (axis36: [number, number, number], a34: 0 | 17 | 30, a36: 0 | 17 | 30): RestorationPlan => ({
    kind: 'splinted-bridge',
    retention: 'screw-to-multi-unit',
    sites: [
      s(34, { impressionCoping: 'multi-unit', axis: [0, 0, 1], multiUnitAngleDeg: a34 }),
      s(36, { impressionCoping: 'multi-unit', axis: axis36, multiUnitAngleDeg: a36 }),
    ],
  });
  it('a 30° multi-unit on implants 8° apart → info at that site, naming the rule and its source', () => {
    const f = validateRestorationPlan(onMua(tilt(8), 0, 30));
    expect(f).toHaveLength(1);
    expect(f[0]).toMatchObject({ severity: 'info', code: C.ANGLED_MULTI_UNIT_NOT_NEEDED, fdi: 36 });
    expect(f[0].source).toContain(PLAN_SOURCES.JANG_2011);
    expect(f[0].message).toMatch(/30° multi-unit.*at most 8°/);
  });
  it('15° exactly is within the limit, so the angle is still not called for', () => {
    expect(codes(onMua(tilt(15), 17, 0))).toEqual([C.ANGLED_MULTI_UNIT_NOT_NEEDED]);
  });
  it('called for once the uncorrected divergence exceeds 15°: no info, and the correction clears the warning', () => {
    expect(codes(onMua(tilt(15.5), 0, 17))).toEqual([]);
    expect(codes(onMua(tilt(40), 0, 30))).toEqual([]);
  });
  it('every angled site is judged on its own: 17° at both where only one pair needs it', () => {
    const plan: RestorationPlan = {
      kind: 'full-arch',
      retention: 'screw-to-multi-unit',
      sites: [
        s(32, { impressionCoping: 'multi-unit', axis: [0, 0, 1], multiUnitAngleDeg: 17 }),
        s(34, { impressionCoping: 'multi-unit', axis: tilt(5), multiUnitAngleDeg: 17 }),
        s(42, { impressionCoping: 'multi-unit', axis: [0, 0, 1] }),
        s(44, { impressionCoping: 'multi-unit', axis: tilt(-25), multiUnitAngleDeg: 30 }),
      ],
    };
    // 32 is 25° from 44 (called for); 34 is 30° from 44 (called for): no info. Straight 42 is never judged.
    expect(codes(plan)).toEqual([]);
    const calm = { ...plan, sites: plan.sites.map((x) => ({ ...x, axis: [0, 0, 1] as [number, number, number] })) };
    expect(validateRestorationPlan(calm).map((f) => f.fdi)).toEqual([32, 34, 44]);
  });
  it('not judged without axes to compare, nor when the retention does not use multi-units', () => {
    const noAxis: RestorationPlan = {
      ...onMua(tilt(8), 0, 30),
      sites: onMua(tilt(8), 0, 30).sites.map(({ axis: _axis, ...x }) => x),
    };
    expect(codes(noAxis)).toEqual([]);
    expect(
      codes({ ...validBridge, sites: [s(34, { axis: [0, 0, 1] }), s(36, { axis: tilt(5), multiUnitAngleDeg: 30 })] }),
    ).toEqual([C.MULTI_UNIT_ANGLE_WITHOUT_ABUTMENT]);
  });
});

describe('insufficient-restorative-space — Carpentieri 2019 [pub]; design follows from the plan', () => {
  it.each([
    [{ kind: 'full-arch', retention: 'screw-to-implant' }, 'full-arch-hybrid'],
    [{ kind: 'full-arch', retention: 'screw-to-multi-unit' }, 'full-arch-hybrid'],
    [{ kind: 'full-arch', retention: 'cement-on-abutment' }, 'cement'],
    [{ kind: 'splinted-bridge', retention: 'screw-to-implant' }, 'screw-implant-level'],
    [{ kind: 'single-crown', retention: 'screw-to-multi-unit' }, 'screw-abutment-level'],
    [{ kind: 'splinted-bridge', retention: 'lingual-set-screw' }, 'cement'],
  ] as const)('%o → %s', (plan, design) => expect(restorativeDesignForPlan(plan)).toBe(design));

  it('uses the smallest space given; equal to the minimum passes, below fails (error with fdi)', () => {
    const plan = (a: number, b?: number): RestorationPlan => ({
      ...validBridge,
      sites: [s(34, { restorativeSpaceMm: a }), s(36, b === undefined ? {} : { restorativeSpaceMm: b })],
    });
    expect(codes(plan(5, 9))).toEqual([]);
    const f = validateRestorationPlan(plan(9, 4.9));
    expect(f).toHaveLength(1);
    expect(f[0]).toMatchObject({
      severity: 'error',
      code: C.INSUFFICIENT_RESTORATIVE_SPACE,
      fdi: 36,
      source: PLAN_SOURCES.CARPENTIERI_2019,
    });
    expect(f[0].message).toContain('4.9 mm');
    expect(f[0].message).toContain('5 mm');
  });
  it('full-arch hybrid needs 15 mm', () => {
    const plan: RestorationPlan = {
      ...validFullArch,
      sites: validFullArch.sites.map((x) => ({ ...x, restorativeSpaceMm: 14.9 })),
    };
    expect(codes(plan)).toEqual([C.INSUFFICIENT_RESTORATIVE_SPACE]);
  });
  it('cemented crown needs 8 mm', () => {
    const plan: RestorationPlan = {
      kind: 'single-crown',
      retention: 'cement-on-abutment',
      sites: [s(11, { interface: 'engaging', impressionCoping: 'engaging', restorativeSpaceMm: 7.5 })],
    };
    expect(codes(plan)).toEqual([C.INSUFFICIENT_RESTORATIVE_SPACE]);
  });
});

describe('site list', () => {
  it('site-count: a single crown has exactly one site', () => {
    expect(codes({ ...validSingle, sites: [] })).toEqual([C.SITE_COUNT]);
    expect(codes({ ...validSingle, sites: [validSingle.sites[0], { ...validSingle.sites[0], fdi: 37 }] })).toEqual([
      C.SITE_COUNT,
    ]);
  });
  it('site-count: a bridge needs at least two', () => {
    expect(codes({ ...validBridge, sites: [s(34)] })).toEqual([C.SITE_COUNT]);
  });
  it('full arch: < 2 error; 2–3 warning [common practice: 4 or more]', () => {
    const fa = (n: number): RestorationPlan => ({ ...validFullArch, sites: validFullArch.sites.slice(0, n) });
    expect(validateRestorationPlan(fa(1)).map((f) => [f.code, f.severity])).toEqual([[C.SITE_COUNT, 'error']]);
    expect(validateRestorationPlan(fa(3)).map((f) => [f.code, f.severity, f.source])).toEqual([
      [C.FEW_IMPLANTS_FULL_ARCH, 'warning', 'common practice'],
    ]);
    expect(codes(fa(4))).toEqual([]);
  });
  it('invalid-position and duplicate-site (errors with fdi)', () => {
    const f = validateRestorationPlan({ ...validBridge, sites: [s(34), s(19), s(34)] });
    expect(f.map((x) => [x.code, x.fdi])).toEqual([
      [C.INVALID_POSITION, 19],
      [C.DUPLICATE_SITE, 34],
    ]);
  });
  it('primary-tooth position → warning', () => {
    const f = validateRestorationPlan({ ...validSingle, sites: [{ ...validSingle.sites[0], fdi: 75 }] });
    expect(f.map((x) => [x.code, x.severity, x.fdi])).toEqual([[C.PRIMARY_TOOTH_POSITION, 'warning', 75]]);
  });
  it('a splinted restoration cannot join both arches', () => {
    expect(codes({ ...validBridge, sites: [s(14), s(44)] })).toEqual([C.SITES_IN_BOTH_ARCHES]);
  });
  it('every finding has a source and plain-English message', () => {
    const f = validateRestorationPlan({
      kind: 'splinted-bridge',
      retention: 'screw-to-implant',
      copingsSplinted: true,
      sites: [
        s(19, { interface: 'engaging', impressionCoping: 'engaging' }),
        s(14, { impressionCoping: 'engaging', axis: [0, 0, 1] }),
        s(44, { axis: [1, 0, 0], restorativeSpaceMm: 1 }),
      ],
    });
    expect(f.length).toBeGreaterThan(5);
    for (const x of f) {
      expect(x.source).toBeTruthy();
      expect(x.message.length).toBeGreaterThan(20);
    }
  });
});

describe('malformed plans throw ValidationError', () => {
  it.each<[string, unknown]>([
    ['unknown kind', { ...validSingle, kind: 'denture' }],
    ['unknown retention', { ...validSingle, retention: 'glue' }],
    ['sites not a list', { ...validSingle, sites: 'x' }],
    ['unknown interface', { ...validSingle, sites: [{ ...validSingle.sites[0], interface: 'hex' }] }],
    ['unknown coping', { ...validSingle, sites: [{ ...validSingle.sites[0], impressionCoping: 'open-tray' }] }],
    ['NaN fdi', { ...validSingle, sites: [{ ...validSingle.sites[0], fdi: Number.NaN }] }],
    ['negative space', { ...validSingle, sites: [{ ...validSingle.sites[0], restorativeSpaceMm: -1 }] }],
    ['zero axis', { ...validBridge, sites: [s(34, { axis: [0, 0, 0] }), s(36)] }],
    ['NaN axis', { ...validBridge, sites: [s(34, { axis: [Number.NaN, 0, 1] }), s(36)] }],
    [
      'multi-unit angle 50, beyond the 0–45° a catalogue may state',
      {
        ...validFullArch,
        sites: [{ ...validFullArch.sites[0], multiUnitAngleDeg: 50 }, ...validFullArch.sites.slice(1)],
      },
    ],
    [
      'negative multi-unit angle',
      {
        ...validFullArch,
        sites: [{ ...validFullArch.sites[0], multiUnitAngleDeg: -5 }, ...validFullArch.sites.slice(1)],
      },
    ],
    ['copingsSplinted not boolean', { ...validBridge, copingsSplinted: 'yes' }],
  ])('%s', (_n, plan) => expect(() => validateRestorationPlan(plan as RestorationPlan)).toThrow(ValidationError));
});

describe('isRetrievable — a cemented restoration is cut off, screws are undone [common practice]', () => {
  it('is false only for cement-on-abutment', () => {
    expect(RETENTIONS.filter((r) => !isRetrievable(r))).toEqual(['cement-on-abutment']);
  });
  it('refuses an unknown retention', () => {
    expect(() => isRetrievable('glued' as never)).toThrow(ValidationError);
  });
});
