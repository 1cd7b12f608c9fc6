/**
 * Bone-level success criteria.
 *
 * Albrektsson T, Zarb G, Worthington P, Eriksson AR 1986, Int J Oral Maxillofac Implants 1:11–25 [pub]:
 * vertical bone loss < 0.2 mm per year after the first year of function. The often-quoted < 1.5 mm in the
 * first year is attributed to this paper and to Smith & Zarb 1989, J Prosthet Dent 62:567 [memory for the latter].
 * Cumulative allowance after n ≥ 1 years: 1.5 + 0.2 × (n − 1) mm [derived].
 *
 * ICOI Pisa health scale, Misch CE et al. 2008, Implant Dent 17(1):5–15 [pub].
 *
 * Decisions for {@link meetsAlbrektsson} where the sources are silent (also in docs/clinical-rules.md):
 * - Reference: the reading closest to the loading date, within ±90 days (ties → the later reading).
 * - First-year loss: reading nearest the first anniversary of loading, within ±90 days (ties → later),
 *   minus the reference. Not rescaled to exactly 12 months.
 * - Annual loss after year 1: least-squares slope (mm/year, 365.25-day years) through the year-1 reading
 *   and every later reading; needs the last reading ≥ 1 year after the year-1 reading, otherwise null.
 * - Comparisons are strict as published (< 1.5 mm, < 0.2 mm/yr) on values rounded to 0.0001 mm,
 *   so exactly 1.5 mm fails.
 * - meets = false when the first-year loss cannot be computed (reference or year-1 reading missing);
 *   when only the annual rate cannot be computed yet (follow-up too short), meets reflects the first year
 *   alone and a reason says the annual criterion is not yet assessable.
 */
import { addCalendarMonths, daysBetween, parseIsoDate } from './calendar.js';
import { ValidationError } from './errors.js';
import { fmt, requireArray, requireFinite, requireNonNegative, requireOneOf } from './validate.js';

/** First-year allowance, mm (Albrektsson 1986 / Smith & Zarb 1989 [memory]). */
export const ALBREKTSSON_FIRST_YEAR_MM = 1.5;
/** Annual allowance after the first year, mm/year (Albrektsson 1986) [pub]. */
export const ALBREKTSSON_ANNUAL_MM = 0.2;

/** One radiographic bone-level reading (mm from the implant reference point to the first bone contact; larger = more loss). */
export interface BoneLevelReading {
  /** YYYY-MM-DD. */
  date: string;
  /** Bone level, mm. May be negative when bone lies coronal to the reference point. */
  boneLevelMm: number;
}

/** Windows used by {@link meetsAlbrektsson}. */
export interface AlbrektssonOptions {
  /** Maximum distance of the reference reading from the loading date, days. Default 90. */
  referenceWindowDays?: number;
  /** Maximum distance of the year-1 reading from the first anniversary of loading, days. Default 90. */
  yearOneWindowDays?: number;
  /** Minimum span from the year-1 reading to the last reading for an annual rate, years. Default 1. */
  minRateSpanYears?: number;
  /**
   * How the reasons write a date for their reader (the practice's order, issue 15 §7; the API
   * passes its printer). The domain has no date format of its own: YYYY-MM-DD when none is given.
   */
  writeDate?: (iso: string) => string;
}

/** Result of {@link meetsAlbrektsson}. */
export interface AlbrektssonResult {
  meets: boolean;
  /** Loss from the reference to the year-1 reading, mm (negative = gain); null when it cannot be computed. */
  firstYearLossMm: number | null;
  /** Least-squares loss rate after year 1, mm/year (negative = gain); null when it cannot be computed. */
  annualLossAfterFirstYearMm: number | null;
  reasons: string[];
}

const round4 = (n: number): number => Math.round(n * 1e4) / 1e4;
const YEAR_DAYS = 365.25;

/**
 * Cumulative bone-loss allowance after `yearsInFunction` years: 1.5 + 0.2 × (n − 1) mm for n ≥ 1 [derived];
 * 1.5 mm during the first year (0 ≤ n < 1) [decision: the first-year allowance covers the whole first year].
 * @throws ValidationError for NaN or negative years
 */
export function albrektssonAllowanceMm(yearsInFunction: number): number {
  const n = requireNonNegative(yearsInFunction, 'yearsInFunction');
  if (n < 1) return ALBREKTSSON_FIRST_YEAR_MM;
  return round4(ALBREKTSSON_FIRST_YEAR_MM + ALBREKTSSON_ANNUAL_MM * (n - 1));
}

interface Point {
  date: string;
  t: number; // days from loading
  level: number;
}

function nearest(points: Point[], targetDay: number, windowDays: number): Point | null {
  let best: Point | null = null;
  for (const p of points) {
    const dist = Math.abs(p.t - targetDay);
    if (dist > windowDays) continue;
    if (best === null || dist < Math.abs(best.t - targetDay) || (dist === Math.abs(best.t - targetDay) && p.t > best.t))
      best = p;
  }
  return best;
}

/**
 * The reading {@link meetsAlbrektsson} takes as its reference: the one closest to the loading date within
 * ±`windowDays` (ties → the later reading); null when none is that close.
 * @throws ValidationError for malformed dates or a negative window
 */
export function albrektssonReference(
  series: BoneLevelReading[],
  loadingDate: string,
  windowDays = 90,
): BoneLevelReading | null {
  parseIsoDate(loadingDate, 'loadingDate');
  const window = requireNonNegative(windowDays, 'windowDays');
  const points = (requireArray(series, 'series') as BoneLevelReading[]).map((r, i) => {
    parseIsoDate(r.date, `series[${i}].date`);
    return { date: r.date, t: daysBetween(loadingDate, r.date), level: requireFinite(r.boneLevelMm, `series[${i}]`) };
  });
  const ref = nearest(points, 0, window);
  return ref ? { date: ref.date, boneLevelMm: ref.level } : null;
}

function slope(points: Point[]): number {
  const xs = points.map((p) => p.t / YEAR_DAYS);
  const ys = points.map((p) => p.level);
  const mx = xs.reduce((a, b) => a + b, 0) / xs.length;
  const my = ys.reduce((a, b) => a + b, 0) / ys.length;
  let num = 0;
  let den = 0;
  for (let i = 0; i < xs.length; i++) {
    num += (xs[i] - mx) * (ys[i] - my);
    den += (xs[i] - mx) ** 2;
  }
  return num / den;
}

/**
 * Judges a series of bone-level readings of one implant against the Albrektsson 1986 criteria
 * (< 1.5 mm in the first year of function, < 0.2 mm per year afterwards). See the module comment for
 * how the reference, the first-year loss and the annual rate are chosen.
 * @throws ValidationError for malformed dates or non-finite bone levels
 */
export function meetsAlbrektsson(
  series: BoneLevelReading[],
  loadingDate: string,
  options?: AlbrektssonOptions,
): AlbrektssonResult {
  parseIsoDate(loadingDate, 'loadingDate');
  const list = requireArray(series, 'series') as BoneLevelReading[];
  const refWindow =
    options?.referenceWindowDays === undefined
      ? 90
      : requireNonNegative(options.referenceWindowDays, 'options.referenceWindowDays');
  const y1Window =
    options?.yearOneWindowDays === undefined
      ? 90
      : requireNonNegative(options.yearOneWindowDays, 'options.yearOneWindowDays');
  const minSpan =
    options?.minRateSpanYears === undefined
      ? 1
      : requireNonNegative(options.minRateSpanYears, 'options.minRateSpanYears');
  if (y1Window >= 182) {
    throw new ValidationError(
      'out-of-range',
      'The first-year window must be shorter than 182 days',
      'options.yearOneWindowDays',
    );
  }

  const points: Point[] = list.map((r, i) => {
    if (r === null || typeof r !== 'object')
      throw new ValidationError('bad-value', 'A bone-level measurement is missing', `series[${i}]`);
    parseIsoDate(r.date, `series[${i}].date`);
    return {
      date: r.date,
      t: daysBetween(loadingDate, r.date),
      level: requireFinite(r.boneLevelMm, `series[${i}].boneLevelMm`),
    };
  });
  points.sort((a, b) => a.t - b.t);

  const writeDate = options?.writeDate ?? ((iso: string) => iso);
  const reasons: string[] = [];
  const fail = (reason: string): AlbrektssonResult => ({
    meets: false,
    firstYearLossMm: null,
    annualLossAfterFirstYearMm: null,
    reasons: [...reasons, reason],
  });
  if (points.length === 0) return fail('no bone-level readings: the criteria cannot be assessed');

  const ref = nearest(points, 0, refWindow);
  if (!ref)
    return fail(
      `no reading within ${refWindow} days of loading (${writeDate(loadingDate)}) to serve as reference: the criteria cannot be assessed`,
    );
  reasons.push(`reference: ${writeDate(ref.date)}, bone level ${fmt(ref.level)} mm`);

  const anniversary = daysBetween(loadingDate, addCalendarMonths(loadingDate, 12, 'loadingDate'));
  const y1 = nearest(
    points.filter((p) => p.t > ref.t),
    anniversary,
    y1Window,
  );
  if (!y1)
    return fail(
      `no reading within ${y1Window} days of the first anniversary of loading: first-year loss cannot be assessed`,
    );

  const firstYearLossMm = round4(y1.level - ref.level);
  const firstOk = firstYearLossMm < ALBREKTSSON_FIRST_YEAR_MM;
  reasons.push(
    `first-year loss ${fmt(firstYearLossMm)} mm (reading ${writeDate(y1.date)}): ${firstOk ? 'below' : 'not below'} ${ALBREKTSSON_FIRST_YEAR_MM} mm`,
  );

  const later = points.filter((p) => p.t > y1.t);
  let annualLossAfterFirstYearMm: number | null = null;
  let annualOk = true;
  if (later.length === 0) {
    reasons.push('no readings after the year-1 reading: the annual criterion (< 0.2 mm/year) is not yet assessable');
  } else {
    const spanYears = (later[later.length - 1].t - y1.t) / YEAR_DAYS;
    if (spanYears < minSpan) {
      reasons.push(
        `readings after year 1 span only ${fmt(spanYears)} years (at least ${fmt(minSpan)} needed): the annual criterion is not yet assessable`,
      );
    } else {
      annualLossAfterFirstYearMm = round4(slope([y1, ...later]));
      annualOk = annualLossAfterFirstYearMm < ALBREKTSSON_ANNUAL_MM;
      reasons.push(
        `loss after year 1 ${fmt(annualLossAfterFirstYearMm)} mm/year over ${fmt(spanYears)} years (least-squares, ${later.length + 1} readings): ${annualOk ? 'below' : 'not below'} ${ALBREKTSSON_ANNUAL_MM} mm/year`,
      );
      const last = later[later.length - 1];
      const years = last.t / YEAR_DAYS;
      reasons.push(
        `cumulative loss ${fmt(last.level - ref.level)} mm after ${fmt(years)} years in function (allowance ${fmt(albrektssonAllowanceMm(years))} mm)`,
      );
    }
  }
  return { meets: firstOk && annualOk, firstYearLossMm, annualLossAfterFirstYearMm, reasons };
}

/** ICOI Pisa health-scale groups, best first. */
export const ICOI_GRADES = ['I', 'II', 'III', 'IV'] as const;
/** ICOI Pisa health-scale group. */
export type IcoiGrade = (typeof ICOI_GRADES)[number];

/** Input of {@link icoiGrade}. */
export interface IcoiInput {
  /** Radiographic bone loss from the level at surgery, mm (negative = gain). */
  boneLossMm: number;
  /** Implant length, mm (> 0). */
  implantLengthMm: number;
  /** Any mobility. */
  mobility: boolean;
  /** Pain on function. */
  painOnFunction: boolean;
  /** Exudate: none, history of exudate, or uncontrolled exudate now. */
  exudate: 'none' | 'history' | 'uncontrolled';
  /** Deepest probing depth, mm. */
  maxProbingDepthMm?: number;
  /** false when the implant is no longer in the mouth. Default true. */
  inMouth?: boolean;
}

/**
 * ICOI Pisa health scale (Misch CE et al. 2008, Implant Dent 17(1):5–15) [pub]:
 * IV failure — pain on function, any mobility, bone loss > ½ of the implant length, uncontrolled exudate,
 * or no longer in the mouth; III compromised survival — bone loss > 4 mm (less than ½ of the implant body),
 * PD > 7 mm, or a history of exudate; II satisfactory survival — 2–4 mm; I success — < 2 mm.
 * Boundaries as published: exactly 2 mm → II, exactly 4 mm → II, PD exactly 7 mm does not make III,
 * loss of exactly ½ the length → III (IV needs "more than ½") [decision at the exact half].
 * @throws ValidationError for NaN, non-positive length, negative PD, unknown exudate value
 */
export function icoiGrade(input: IcoiInput): IcoiGrade {
  if (input === null || typeof input !== 'object')
    throw new ValidationError('bad-value', 'The grading details are missing', 'input');
  const loss = requireFinite(input.boneLossMm, 'boneLossMm');
  const length = requireFinite(input.implantLengthMm, 'implantLengthMm');
  if (length <= 0)
    throw new ValidationError('out-of-range', 'Enter an implant length greater than 0', 'implantLengthMm');
  if (typeof input.mobility !== 'boolean') throw new ValidationError('bad-value', 'Choose yes or no', 'mobility');
  if (typeof input.painOnFunction !== 'boolean')
    throw new ValidationError('bad-value', 'Choose yes or no', 'painOnFunction');
  const exudate = requireOneOf(input.exudate, ['none', 'history', 'uncontrolled'] as const, 'exudate');
  const pd =
    input.maxProbingDepthMm === undefined
      ? undefined
      : requireNonNegative(input.maxProbingDepthMm, 'maxProbingDepthMm');
  if (input.inMouth !== undefined && typeof input.inMouth !== 'boolean')
    throw new ValidationError('bad-value', 'Choose yes or no', 'inMouth');

  const EPS = 1e-9;
  if (
    input.inMouth === false ||
    input.mobility ||
    input.painOnFunction ||
    exudate === 'uncontrolled' ||
    loss > length / 2 + EPS
  )
    return 'IV';
  if (loss > 4 + EPS || (pd !== undefined && pd > 7 + EPS) || exudate === 'history') return 'III';
  if (loss >= 2 - EPS) return 'II';
  return 'I';
}
