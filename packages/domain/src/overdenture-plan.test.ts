import { describe, it, expect } from 'vitest';
import { PLAN_FINDING_CODES as C, PLAN_SOURCES } from './plan-findings.js';
import { validateRestorationPlan, type RestorationPlan, type RestorationPlanSite } from './restoration-plan.js';
import type { AttachmentFacts } from './overdenture-plan.js';

// Two implants as the minimum for a mandibular overdenture: McGill consensus (Feine JS et al. 2002) and
// York consensus (Thomason JM et al. 2009) [memory: citations recalled]. Tolerances are the catalogue's:
// the values here are invented catalogue entries. Worked divergences: two axes tilted ±a in one plane
// diverge by exactly 2a (angle between (sin a, 0, cos a) and (−sin a, 0, cos a) is acos(cos 2a)).

const tilt = (deg: number): [number, number, number] => [
  Math.sin((deg * Math.PI) / 180),
  0,
  Math.cos((deg * Math.PI) / 180),
];
const stud = (over: Partial<AttachmentFacts> = {}): AttachmentFacts => ({
  name: 'Test stud 2 mm',
  maxDivergenceDeg: 20,
  collarHeightMm: 2,
  ...over,
});
const site = (fdi: number, extra: Partial<RestorationPlanSite> = {}): RestorationPlanSite => ({
  fdi,
  interface: 'non-engaging',
  impressionCoping: 'non-engaging',
  ...extra,
});
const studPlan = (sites: RestorationPlanSite[]): RestorationPlan => ({
  kind: 'overdenture-studs',
  retention: 'screw-to-implant',
  sites,
});
const codes = (plan: RestorationPlan) => validateRestorationPlan(plan).map((f) => f.code);

describe('overdenture on stud attachments', () => {
  it('two implants at 33 and 43 with stated values and parallel axes is valid (McGill 2002, York 2009)', () => {
    const plan = studPlan([
      site(33, { axis: [0, 0, 1], attachment: stud() }),
      site(43, { axis: [0, 0, 1], attachment: stud() }),
    ]);
    expect(validateRestorationPlan(plan)).toEqual([]);
  });

  it('one implant is an error citing the two-implant consensus', () => {
    const [f] = validateRestorationPlan(studPlan([site(33, { attachment: stud() })]));
    expect(f).toMatchObject({ severity: 'error', code: C.SITE_COUNT, source: PLAN_SOURCES.OVERDENTURE_CONSENSUS });
    expect(f.message).toContain('at least two implants');
  });

  it('engaging copings and interfaces are not judged: a stud is round [common practice]', () => {
    const plan = studPlan([
      site(33, { interface: 'engaging', impressionCoping: 'engaging', attachment: stud() }),
      site(43, { interface: 'non-engaging', impressionCoping: 'non-engaging', attachment: stud() }),
    ]);
    expect(codes(plan)).toEqual([]);
  });

  it('a site without an attachment abutment is an error naming the site', () => {
    const findings = validateRestorationPlan(studPlan([site(33, { attachment: stud() }), site(43)]));
    expect(findings).toEqual([expect.objectContaining({ severity: 'error', code: C.ATTACHMENT_MISSING, fdi: 43 })]);
  });

  it('cement retention is an error: stud attachments are screwed into the implant [common practice]', () => {
    const plan = { ...studPlan([site(33, { attachment: stud() }), site(43, { attachment: stud() })]) };
    plan.retention = 'cement-on-abutment';
    expect(codes(plan)).toContain(C.OVERDENTURE_RETENTION);
  });

  it('sites in both arches are an error: one denture per arch', () => {
    const plan = studPlan([site(13, { attachment: stud() }), site(43, { attachment: stud() })]);
    expect(codes(plan)).toContain(C.SITES_IN_BOTH_ARCHES);
  });

  describe('divergence against the attachment stated tolerance (20° in this invented catalogue entry)', () => {
    const pair = (halfAngle: number, a = stud(), b = stud()) =>
      studPlan([
        site(33, { axis: tilt(halfAngle), attachment: a }),
        site(43, { axis: tilt(-halfAngle), attachment: b }),
      ]);

    it('19.8° apart (±9.9°) is just inside: no finding', () => {
      expect(validateRestorationPlan(pair(9.9))).toEqual([]);
    });

    it('exactly 20° apart is inside (the stated value is allowed)', () => {
      expect(validateRestorationPlan(pair(10))).toEqual([]);
    });

    it('20.2° apart (±10.1°) is just outside: a warning with both sites, the angle and the part', () => {
      const findings = validateRestorationPlan(pair(10.1));
      expect(findings).toHaveLength(1);
      expect(findings[0]).toMatchObject({
        severity: 'warning',
        code: C.ATTACHMENT_DIVERGENCE_OVER_TOLERANCE,
        source: PLAN_SOURCES.CATALOGUE,
      });
      expect(findings[0].message).toContain('33 and 43 diverge by 20.2°');
      expect(findings[0].message).toContain('20° the catalogue states for Test stud 2 mm');
    });

    it('a pair is judged against the stricter of its two attachments', () => {
      const wide = stud({ name: 'Wide stud', maxDivergenceDeg: 40 });
      const narrow = stud({ name: 'Narrow stud', maxDivergenceDeg: 20 });
      const findings = validateRestorationPlan(pair(15, wide, narrow));
      expect(findings).toHaveLength(1);
      expect(findings[0].message).toContain('Narrow stud (at 43)');
      expect(validateRestorationPlan(pair(15, wide, wide))).toEqual([]);
    });

    it('a part without a stated tolerance is a warning naming it, and its pairs are not judged', () => {
      const unknown = stud({ name: 'Unlabelled stud', maxDivergenceDeg: null });
      const findings = validateRestorationPlan(pair(30, unknown, stud()));
      expect(findings).toEqual([
        expect.objectContaining({ severity: 'warning', code: C.CATALOGUE_VALUE_MISSING, fdi: 33 }),
      ]);
      expect(findings[0].message).toContain('the catalogue does not state the divergence tolerance of Unlabelled stud');
    });

    it('a part without a stated collar height is a warning naming it', () => {
      const findings = validateRestorationPlan(pair(0, stud({ name: 'Short stud', collarHeightMm: null })));
      expect(findings[0].message).toContain('the catalogue does not state the collar height of Short stud');
    });
  });
});

describe('overdenture on a bar: splinted like a bridge', () => {
  const bar = (fdis: number[], extra: Partial<RestorationPlanSite> = {}): RestorationPlan => ({
    kind: 'overdenture-bar',
    retention: 'screw-to-implant',
    sites: fdis.map((fdi) => site(fdi, { axis: [0, 0, 1], ...extra })),
  });

  it('four maxillary implants on non-engaging connections is valid', () => {
    expect(validateRestorationPlan(bar([14, 12, 22, 24]))).toEqual([]);
  });

  it('engaging connections on a bar screwed to the implants are an error, as on a bridge [common practice]', () => {
    expect(codes(bar([33, 43], { interface: 'engaging' }))).toContain(C.ENGAGING_INTERFACE_ON_SPLINTED);
  });

  it('implants more than 15° apart get the impression warning of splinted work (Jang 2011)', () => {
    const plan = bar([33, 43]);
    plan.sites[1].axis = tilt(16);
    expect(codes(plan)).toEqual([C.DIVERGENCE_OVER_LIMIT]);
  });

  it('under 11 mm of restorative space is an error (Carpentieri 2019: bar overdenture 11 mm)', () => {
    expect(codes(bar([33, 43], { restorativeSpaceMm: 10.9 }))).toEqual([C.INSUFFICIENT_RESTORATIVE_SPACE]);
    expect(codes(bar([33, 43], { restorativeSpaceMm: 11 }))).toEqual([]);
  });

  it('a lingual set screw is an error; multi-unit abutments are allowed', () => {
    expect(codes({ ...bar([33, 43]), retention: 'lingual-set-screw' })).toContain(C.OVERDENTURE_RETENTION);
    expect(codes(bar([33, 43], { impressionCoping: 'multi-unit' }))).toContain(
      C.MULTI_UNIT_IMPRESSION_WITHOUT_ABUTMENT,
    );
    expect(codes({ ...bar([33, 43], { impressionCoping: 'multi-unit' }), retention: 'screw-to-multi-unit' })).toEqual(
      [],
    );
  });

  it('a single implant is an error', () => {
    expect(codes(bar([33]))).toContain(C.SITE_COUNT);
  });
});
