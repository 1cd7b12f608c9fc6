import { describe, it, expect } from 'vitest';
import { PERI_IMPLANT_FLAGS as F } from './choices.js';
import { classifyPeriImplant, type PeriImplantSite } from './peri-implant-status.js';
import { ValidationError } from './errors.js';

// Sources: Berglundh T et al. 2018, consensus report of workgroup 4, J Clin Periodontol 45(S20):S286–S291 /
// J Periodontol 89(S1):S313–S318 [pub]; Renvert S et al. 2018, J Periodontol 89(S1):S304–S312 [pub].
// Thresholds 1 mm PD increase and 0.5 mm bone loss: [common practice] defaults.

const site = (pd: number, bleeding = false, suppuration = false): PeriImplantSite => ({
  probingDepthMm: pd,
  bleeding,
  suppuration,
});
const base = (pds: number[], boneLevelMm: number) => ({ sites: pds.map((p) => ({ probingDepthMm: p })), boneLevelMm });

describe('reference §1 check cases (Berglundh 2018 [pub], defaults [common practice])', () => {
  it('1. BOP−, SUP−, max PD 4 (baseline 4), bone loss 0.2 → health', () => {
    const r = classifyPeriImplant(
      { sites: [site(3), site(4), site(3), site(2)], boneLevelMm: 1.2 },
      base([3, 4, 3, 2], 1.0),
    );
    expect(r.status).toBe('health');
    expect(r.flags).toEqual([]);
  });
  it('2. BOP+, PD 5 (baseline 4), bone loss 0.3 → mucositis', () => {
    const r = classifyPeriImplant({ sites: [site(5, true), site(3)], boneLevelMm: 1.3 }, base([4, 3], 1.0));
    expect(r.status).toBe('mucositis');
    expect(r.reasons[0]).toBe('site 1: BOP, PD 5 mm (baseline 4 mm, +1 mm) → mucositis');
  });
  it('3. BOP+, PD 7 (baseline 4), bone loss 2.5 → peri-implantitis', () => {
    const r = classifyPeriImplant({ sites: [site(3), site(7, true)], boneLevelMm: 3.5 }, base([3, 4], 1.0));
    expect(r.status).toBe('peri-implantitis');
    expect(r.reasons).toContain('site 2: BOP, PD 7 mm (baseline 4 mm, +3 mm) → peri-implantitis');
    expect(r.flags).toEqual([]);
  });
  it('4. no baseline: BOP+, PD 6.0, bone level 3.0 → peri-implantitis (both limits inclusive)', () => {
    const r = classifyPeriImplant({ sites: [site(6.0, true)], boneLevelMm: 3.0 });
    expect(r.status).toBe('peri-implantitis');
    expect(r.flags).toEqual([F.NO_BASELINE]);
  });
  it('5. no baseline: BOP−, SUP−, PD 6, bone level 3.2 → not peri-implantitis (no inflammation)', () => {
    const r = classifyPeriImplant({ sites: [site(6), site(4)], boneLevelMm: 3.2 });
    expect(r.status).not.toBe('peri-implantitis');
    expect(r.status).toBe('health');
    expect(r.flags).toContain(F.BONE_LOSS_WITHOUT_INFLAMMATION); // [decision]
  });
});

describe('no-baseline rule: consensus report reading, all three criteria (Berglundh 2018 [pub])', () => {
  it('BOP+ with PD ≥ 6 but bone level < 3 → mucositis, flagged: cannot exclude without baseline', () => {
    const r = classifyPeriImplant({ sites: [site(6, true)], boneLevelMm: 2.9 });
    expect(r.status).toBe('mucositis');
    expect(r.flags).toContain(F.PERI_IMPLANTITIS_NOT_EXCLUDED_WITHOUT_BASELINE);
    expect(r.flags).toContain(F.NO_BASELINE);
  });
  it('SUP+ with bone level ≥ 3 but PD < 6 → mucositis, flagged (case-definition paper "and/or" not followed)', () => {
    const r = classifyPeriImplant({ sites: [site(5.9, false, true)], boneLevelMm: 4 });
    expect(r.status).toBe('mucositis');
    expect(r.flags).toContain(F.PERI_IMPLANTITIS_NOT_EXCLUDED_WITHOUT_BASELINE);
  });
  it('BOP+ with neither limit → mucositis without the not-excluded flag', () => {
    const r = classifyPeriImplant({ sites: [site(4, true)], boneLevelMm: 1 });
    expect(r.status).toBe('mucositis');
    expect(r.flags).toEqual([F.NO_BASELINE]);
  });
  it('SUP alone counts as inflammation: SUP+, PD 6, bone 3 → peri-implantitis', () => {
    expect(classifyPeriImplant({ sites: [site(6, false, true)], boneLevelMm: 3 }).status).toBe('peri-implantitis');
  });
  it('just below the limits (PD 5.99, bone 2.99) is not peri-implantitis', () => {
    expect(classifyPeriImplant({ sites: [site(5.99, true)], boneLevelMm: 3 }).status).toBe('mucositis');
    expect(classifyPeriImplant({ sites: [site(6, true)], boneLevelMm: 2.99 }).status).toBe('mucositis');
  });
  it('the three criteria must meet at one site: BOP at a shallow site, PD 6 at a quiet site → mucositis', () => {
    const r = classifyPeriImplant({ sites: [site(3, true), site(6)], boneLevelMm: 3.5 });
    expect(r.status).toBe('mucositis');
    expect(r.reasons).toContain('site 2: PD 6 mm without bleeding or suppuration');
  });
});

describe('no baseline and no bone level [decision]: never peri-implantitis, always flagged', () => {
  it('BOP+, PD 8 → mucositis, flags no-baseline, bone-level-missing, not-excluded', () => {
    const r = classifyPeriImplant({ sites: [site(8, true)] });
    expect(r.status).toBe('mucositis');
    expect(r.flags).toEqual(
      expect.arrayContaining([F.NO_BASELINE, F.BONE_LEVEL_MISSING, F.PERI_IMPLANTITIS_NOT_EXCLUDED_WITHOUT_BASELINE]),
    );
  });
  it('BOP+, PD 4 → mucositis with bone-level-missing only', () => {
    const r = classifyPeriImplant({ sites: [site(4, true)] });
    expect(r.status).toBe('mucositis');
    expect(r.flags).toEqual([F.NO_BASELINE, F.BONE_LEVEL_MISSING]);
  });
  it('no inflammation → health, still flagged bone-level-missing', () => {
    const r = classifyPeriImplant({ sites: [site(3), site(3)] });
    expect(r.status).toBe('health');
    expect(r.flags).toEqual([F.NO_BASELINE, F.BONE_LEVEL_MISSING]);
  });
});

describe('with baseline (Berglundh 2018 [pub]; thresholds [common practice], inclusive [decision])', () => {
  it('PD increase of exactly 1 mm and bone loss of exactly 0.5 mm count (inclusive, float-safe)', () => {
    // 4.3 − 3.3 = 0.9999999999999996 in floating point; 1.7 − 1.2 = 0.5 (approximately)
    const r = classifyPeriImplant({ sites: [site(4.3, true)], boneLevelMm: 1.7 }, base([3.3], 1.2));
    expect(r.status).toBe('peri-implantitis');
  });
  it('PD increase 0.9 mm with bone loss → mucositis', () => {
    expect(classifyPeriImplant({ sites: [site(4.9, true)], boneLevelMm: 3 }, base([4], 1)).status).toBe('mucositis');
  });
  it('bone loss 0.49 mm with PD increase → mucositis', () => {
    expect(classifyPeriImplant({ sites: [site(7, true)], boneLevelMm: 1.49 }, base([4], 1)).status).toBe('mucositis');
  });
  it('options change the thresholds', () => {
    const exam = { sites: [site(5, true)], boneLevelMm: 1.3 };
    expect(classifyPeriImplant(exam, base([4], 1)).status).toBe('mucositis');
    expect(classifyPeriImplant(exam, base([4], 1), { boneLossMm: 0.3 }).status).toBe('peri-implantitis');
    expect(classifyPeriImplant(exam, base([4], 1), { boneLossMm: 0.3, pdIncreaseMm: 2 }).status).toBe('mucositis');
  });
  it('status from the worst site, per-site reasons kept', () => {
    const r = classifyPeriImplant(
      { sites: [site(4, true), site(3), site(8, true, true), site(3)], boneLevelMm: 3 },
      base([4, 3, 4, 3], 1),
    );
    expect(r.status).toBe('peri-implantitis');
    expect(r.reasons).toContain('site 1: BOP, PD 4 mm (baseline 4 mm, +0 mm) → mucositis');
    expect(r.reasons).toContain('site 3: BOP, SUP, PD 8 mm (baseline 4 mm, +4 mm) → peri-implantitis');
  });
  it('baseline given but no current bone level: mucositis, flagged bone-level-missing [decision]', () => {
    const r = classifyPeriImplant({ sites: [site(8, true)] }, base([4], 1));
    expect(r.status).toBe('mucositis');
    expect(r.flags).toEqual([F.BONE_LEVEL_MISSING]);
  });
  it('bone loss without inflammation → health, flagged [decision]', () => {
    const r = classifyPeriImplant({ sites: [site(6)], boneLevelMm: 3 }, base([4], 1));
    expect(r.status).toBe('health');
    expect(r.flags).toEqual([F.BONE_LOSS_WITHOUT_INFLAMMATION]);
  });
  it('health can exist with reduced bone support (Renvert 2018 [pub]): stable deep level, no BOP → health, no flag', () => {
    const r = classifyPeriImplant({ sites: [site(5)], boneLevelMm: 4 }, base([5], 4));
    expect(r.status).toBe('health');
    expect(r.flags).toEqual([]);
  });
});

describe('flag constants are stable strings', () => {
  it('values', () => {
    expect(F).toEqual({
      NO_BASELINE: 'no-baseline',
      PERI_IMPLANTITIS_NOT_EXCLUDED_WITHOUT_BASELINE: 'peri-implantitis-not-excluded-without-baseline',
      BONE_LEVEL_MISSING: 'bone-level-missing',
      BONE_LOSS_WITHOUT_INFLAMMATION: 'bone-loss-without-inflammation',
    });
    expect(Object.isFrozen(F)).toBe(true);
  });
});

describe('invalid input → ValidationError with a code', () => {
  const bad: [string, () => unknown, string][] = [
    ['empty site list', () => classifyPeriImplant({ sites: [] }), 'empty'],
    ['NaN depth', () => classifyPeriImplant({ sites: [site(Number.NaN, true)] }), 'not-a-number'],
    ['negative depth', () => classifyPeriImplant({ sites: [site(-1)] }), 'out-of-range'],
    ['negative bone level', () => classifyPeriImplant({ sites: [site(3)], boneLevelMm: -0.5 }), 'out-of-range'],
    [
      'Infinity bone level',
      () => classifyPeriImplant({ sites: [site(3)], boneLevelMm: Number.POSITIVE_INFINITY }),
      'not-a-number',
    ],
    [
      'non-boolean bleeding',
      () =>
        classifyPeriImplant({
          sites: [{ probingDepthMm: 3, bleeding: 'yes', suppuration: false } as unknown as PeriImplantSite],
        }),
      'bad-value',
    ],
    [
      'baseline site count differs',
      () => classifyPeriImplant({ sites: [site(3), site(3)] }, base([3], 1)),
      'site-mismatch',
    ],
    ['baseline NaN bone level', () => classifyPeriImplant({ sites: [site(3)] }, base([3], Number.NaN)), 'not-a-number'],
    [
      'negative option',
      () => classifyPeriImplant({ sites: [site(3)] }, undefined, { pdIncreaseMm: -1 }),
      'out-of-range',
    ],
  ];
  it.each(bad)('%s', (_name, fn, code) => {
    expect(fn).toThrow(ValidationError);
    expect(fn).toThrow(expect.objectContaining({ code }));
  });
});
