// The package root is what the API and the web import. Each public function is called here
// through the root with one check case taken from its own module's test (which names the
// published source); a root that re-exported a stale or wrong implementation would fail here,
// where a check of `typeof … === 'function'` could not.
import { describe, it, expect } from 'vitest';
import * as domain from './index.js';

describe('package root answers through the public API', () => {
  it.each<[string, () => unknown, unknown]>([
    // tooth-numbering.test.ts: HL7 ADA Universal table [pub], ISO 3950 [memory], anatomy [common practice]
    ['fdiToUniversal', () => domain.fdiToUniversal(21), '9'],
    ['universalToFdi', () => domain.universalToFdi('a'), 55],
    ['formatTooth', () => domain.formatTooth(36, 'universal'), '19'],
    ['toothKind', () => domain.toothKind(46), 'molar'],
    ['toothArch', () => domain.toothArch(71), 'lower'],
    ['isPrimaryTooth', () => domain.isPrimaryTooth(51), true],
    ['isValidFdi', () => domain.isValidFdi(19), false],
    // peri-implant-status.test.ts case 3 (Berglundh et al. 2018 [pub])
    [
      'classifyPeriImplant',
      () =>
        domain.classifyPeriImplant(
          {
            sites: [
              { probingDepthMm: 3, bleeding: false, suppuration: false },
              { probingDepthMm: 7, bleeding: true, suppuration: false },
            ],
            boneLevelMm: 3.5,
          },
          { sites: [{ probingDepthMm: 3 }, { probingDepthMm: 4 }], boneLevelMm: 1.0 },
        ).status,
      'peri-implantitis',
    ],
    // udi.test.ts: GS1 examples [pub]
    ['gtinCheckDigit', () => domain.gtinCheckDigit('629104150021'), 3],
    ['isValidGtin', () => domain.isValidGtin('6291041500213'), true],
    [
      'parseUdi',
      () => domain.parseUdi('(01)05012345678900(17)270228(10)ABC123', new Date(Date.UTC(2026, 11, 1))),
      { gtin: '05012345678900', expiry: '2027-02-28', lot: 'ABC123' },
    ],
    // udi-placement.test.ts (GS1 AI 17 use-by date; lot check [common practice])
    [
      'checkUdiForPlacement',
      () =>
        domain
          .checkUdiForPlacement(
            { gtin: '08845212345677', lot: 'SCN3511-26X', expiry: '2028-12-31' },
            { placedOn: '2030-01-01', lot: 'OTHER' },
          )
          .map((f) => f.code),
      ['lot-mismatch', 'expired-before-placement'],
    ],
    // geometry.test.ts (Jang 2011 [pub] uses the angle between axes)
    ['divergenceDeg', () => Math.round(domain.divergenceDeg([0, 0, 1], [1, 0, 1]) * 1e9) / 1e9, 45],
    // radiograph-measure.test.ts (DICOM Pixel Spacing, row spacing first [pub])
    [
      'pixelDistanceMm',
      () => Math.round(domain.pixelDistanceMm({ row: 10, col: 20 }, { row: 40, col: 60 }, [0.1, 0.1]) * 1e9) / 1e9,
      5,
    ],
    [
      'correctByKnownLength',
      () =>
        Math.round(
          domain.correctByKnownLength({ measuredMm: 2.12, implantMeasuredMm: 10.6, implantTrueMm: 10.0 }) * 1e9,
        ) / 1e9,
      2,
    ],
    // torque.test.ts (ISO 6789 ±6 % [pub])
    ['torqueVerdict', () => domain.torqueVerdict({ appliedNcm: 32.89, specNcm: 35, tolerancePct: 6 }), 'under'],
    // bone-level.test.ts (Albrektsson 1986 [pub], Misch 2008 ICOI scale [pub])
    ['albrektssonAllowanceMm', () => domain.albrektssonAllowanceMm(0.5), 1.5],
    [
      'meetsAlbrektsson',
      () =>
        domain.meetsAlbrektsson(
          [
            { date: '2020-03-01', boneLevelMm: 0 },
            { date: '2021-03-01', boneLevelMm: 1.6 },
            { date: '2022-03-01', boneLevelMm: 1.6 },
            { date: '2023-03-01', boneLevelMm: 1.6 },
          ],
          '2020-03-01',
        ).meets,
      false,
    ],
    [
      'icoiGrade',
      () =>
        domain.icoiGrade({
          boneLossMm: 0.5,
          implantLengthMm: 10,
          mobility: true,
          painOnFunction: false,
          exudate: 'none',
        }),
      'IV',
    ],
    // bone-level.test.ts: the reference is the reading closest to loading [decision, Albrektsson 1986 [pub]]
    [
      'albrektssonReference',
      () =>
        domain.albrektssonReference(
          [
            { date: '2020-02-01', boneLevelMm: 0.2 },
            { date: '2020-03-10', boneLevelMm: 0.4 },
          ],
          '2020-03-01',
        ),
      { date: '2020-03-10', boneLevelMm: 0.4 },
    ],
    // bone-level-record.test.ts: the worse side [common practice], tenths, never below 0 [decision]
    ['worseBoneLevel', () => domain.worseBoneLevel({ mesialMm: 1.2, distalMm: 2.26 }), { mm: 2.26, side: 'distal' }],
    ['examBoneLevelMm', () => domain.examBoneLevelMm({ mesialMm: 1.2, distalMm: 2.26 }), 2.3],
    [
      'boneLevelSummary',
      () =>
        domain.boneLevelSummary({
          readings: [{ date: '2024-01-01', mesialMm: 2.5, distalMm: 1 }],
          loadedOn: null,
          implantLengthMm: 10,
          latestExam: null,
        }).icoi?.grade,
      'II',
    ],
    // restorative-space.test.ts (Carpentieri et al. 2019 [pub], strictest end)
    ['minRestorativeSpaceMm', () => domain.minRestorativeSpaceMm('cement'), 8],
    // restoration-plan.test.ts: a valid cemented single crown gives no finding
    [
      'validateRestorationPlan',
      () =>
        domain.validateRestorationPlan({
          kind: 'single-crown',
          retention: 'cement-on-abutment',
          sites: [{ fdi: 11, interface: 'engaging', impressionCoping: 'engaging', restorativeSpaceMm: 8 }],
        }),
      [],
    ],
    // recall-interval.test.ts (practice policy, 6 months without risk [common practice])
    ['nextRecallDate', () => domain.nextRecallDate('2026-03-15', {}), '2026-09-15'],
    // torque.test.ts: the band is the verdict's own limits (ISO 6789 ±6 % [pub])
    ['torqueToleranceBand', () => domain.torqueToleranceBand(35, 6), { lowNcm: 32.9, highNcm: 37.1 }],
    // retorque.test.ts (Siamos et al. 2002 [pub]: re-tighten about 10 min after the first tightening)
    [
      'retorqueDueAt',
      () => domain.retorqueDueAt([{ reason: 'initial-seating', performedAt: new Date('2026-12-01T10:00:00Z') }]),
      new Date(Date.parse('2026-12-01T10:00:00Z') + domain.RETIGHTEN_AFTER_MINUTES * 60_000).toISOString(),
    ],
    // peri-implant-baseline.test.ts (Berglundh et al. 2018 [pub]: baseline after the prosthesis is completed)
    [
      'choosePeriImplantBaseline',
      () =>
        domain.choosePeriImplantBaseline(
          [
            {
              examinedOn: '2013-01-10',
              recordedAt: '2013-01-10T10:00:00Z',
              isBaseline: false,
              boneLevelMm: 1,
              sites: [],
            },
          ],
          { examinedOn: '2020-01-01', isBaseline: false },
          '2012-09-20',
        )?.examinedOn,
      '2013-01-10',
    ],
    [
      'toPeriImplantExam',
      () =>
        domain.toPeriImplantExam({
          sites: [{ position: 'buccal', probingDepthMm: 4, bleeding: true, suppuration: false }],
          boneLevelMm: null,
        }),
      { sites: [{ probingDepthMm: 4, bleeding: true, suppuration: false }] },
    ],
    [
      'toPeriImplantBaseline',
      () => domain.toPeriImplantBaseline({ isBaseline: true }, { sites: [], boneLevelMm: 1 }),
      undefined,
    ],
    // recall-reminders.test.ts (practice policy [common practice]: 14 days before, 7 after)
    [
      'remindersDue',
      () => domain.remindersDue('2026-12-15', '2026-12-01', { reminderDaysBefore: 14, overdueReminderDaysAfter: 7 }),
      ['upcoming'],
    ],
    // calendar.test.ts (proleptic Gregorian calendar)
    ['addCalendarDays', () => domain.addCalendarDays('2028-02-28', 1), '2028-02-29'],
    // restoration-plan.test.ts (a cemented crown is not retrievable by a screw [common practice])
    ['isRetrievable', () => domain.isRetrievable('cement-on-abutment'), false],
    // survival.test.ts (Bewick et al. 2004, Crit Care 8:389, Table 2 [pub]): 0.750 … 0.000
    [
      'kaplanMeier',
      () =>
        domain
          .kaplanMeier([
            ...[1, 1, 4, 5, 9, 22].map((time) => ({ time, event: true })),
            ...[6, 9].map((time) => ({ time, event: false })),
          ])
          .steps.map((s) => Math.round(s.survival * 1000) / 1000),
      [0.75, 0.625, 0.5, 0.5, 0.333, 0],
    ],
    [
      'survivalAt',
      () =>
        domain.survivalAt(
          domain.kaplanMeier([
            { time: 1, event: true },
            { time: 2, event: false },
          ]),
          1.5,
        ),
      0.5,
    ],
    [
      'numberAtRisk',
      () =>
        domain.numberAtRisk(
          [
            { time: 1, event: true },
            { time: 2, event: false },
          ],
          2,
        ),
      1,
    ],
    // survival.test.ts (reference §11 [derived]): 6 events over 480 implant-years → 1.25
    ['eventsPer100ImplantYears', () => domain.eventsPer100ImplantYears(6, 480), 1.25],
    ['followUpYears', () => domain.followUpYears('2024-01-01', '2025-01-01'), 366 / 365.25],
    // scan-bodies.test.ts [common practice]: the practice asks, the digital impression has none
    [
      'seatingRadiographFindings',
      () => domain.seatingRadiographFindings('digital', false, true).map((f) => f.code),
      ['scan-body-seating-radiograph-missing'],
    ],
    // cantilever.test.ts (English CE 1990 [memory], ratio 1.5 [common practice]): 12 mm spread → 18 mm
    ['cantileverLimitMm', () => domain.cantileverLimitMm(12), 18],
    ['cantileverFindings', () => domain.cantileverFindings({ kind: 'full-arch', leftMm: 18, apSpreadMm: 12 }), []],
    ['recordsCantilevers', () => domain.recordsCantilevers('single-crown'), false],
    // provisional.test.ts [decision]: overdue from the day after the planned replacement
    ['provisionalOverdue', () => domain.provisionalOverdue('2026-11-30', '2026-12-01'), true],
    // insert-changes.test.ts (Cehreli 2010 [memory]; 12 months [common practice]): overdue the day after
    ['insertReviewOverdue', () => domain.insertReviewOverdue('2025-03-14', 12, '2026-03-15'), true],
    ['insertReviewDueOn', () => domain.insertReviewDueOn('2025-03-14', 12), '2026-03-14'],
    ['wholeMonthsBetween', () => domain.wholeMonthsBetween('2025-11-05', '2026-01-05'), 2],
    ['insertChangeSummary', () => domain.insertChangeSummary(['2025-11-05'], '2026-02-01').daysSinceLast, 88],
    // insert-changes.test.ts [decision]: one bar per calendar year from the first change to today's
    [
      'insertChangeHistory',
      () => domain.insertChangeHistory([{ changedOn: '2024-05-02', reason: 'wear' }], '2025-01-01', ['wear']).length,
      2,
    ],
    // part-fit.test.ts [common practice]: a restoration on multi-units is recorded at multi-unit level
    ['impressionLevelFor', () => domain.impressionLevelFor('screw-to-multi-unit'), 'multi-unit'],
    [
      'impressionLevelFindings',
      () => domain.impressionLevelFindings('screw-to-implant', 36, 'coping', { name: 'C', copingLevel: 'implant' }),
      [],
    ],
    [
      'engagingFindings',
      () => domain.engagingFindings({ kind: 'single-crown' }, [{ fdi: 36, abutment: { name: 'A', engaging: true } }]),
      [],
    ],
  ])('%s', (_name, call, expected) => {
    expect(call()).toEqual(expected);
  });

  it('constants and error classes', () => {
    expect(domain.RULES_VERSION).toMatch(/^\d{4}\.\d{1,2}\.\d+$/);
    expect(domain.TOOTH_POSITIONS_PERMANENT).toHaveLength(32);
    expect(domain.TOOTH_POSITIONS_PRIMARY).toHaveLength(20);
    expect(new domain.UdiError('bad-date', 'x')).toBeInstanceOf(domain.DomainError);
    expect(new domain.ValidationError('empty', 'x')).toBeInstanceOf(domain.DomainError);
    expect(new domain.ToothPositionError('x')).toBeInstanceOf(RangeError);
    expect(new domain.UdiError('bad-date', 'x').name).toBe('UdiError');
    expect(domain.PERI_IMPLANT_FLAGS.PERI_IMPLANTITIS_NOT_EXCLUDED_WITHOUT_BASELINE).toBe(
      'peri-implantitis-not-excluded-without-baseline',
    );
  });

  it('throws the typed errors of the package root for invalid input', () => {
    expect(() => domain.fdiToUniversal(19)).toThrow(domain.ToothPositionError);
    expect(() => domain.gtinCheckDigit('12a')).toThrow(domain.UdiError);
    expect(() => domain.minRestorativeSpaceMm('denture' as domain.RestorativeDesign)).toThrow(domain.ValidationError);
  });
});
