/**
 * Recall interval for implant maintenance.
 *
 * Examine implant restorations at least every 6 months, more often at higher risk (Bidra AS et al. 2016,
 * J Prosthodont 25(S1):S32–S40, for tooth-borne restorations; the implant guideline likewise [memory]).
 * Risk-based programme: Herrera D et al. 2023, EFP S3 guideline, J Clin Periodontol 50(S26):4–76 [pub].
 * No published algorithm fixes the interval: this is a practice policy [common practice] —
 * default 6 months, 3 months with any risk factor (smoking, poorly controlled diabetes,
 * history of periodontitis, prior peri-implantitis).
 */
import { addCalendarMonths } from './calendar.js';
import { ValidationError } from './errors.js';
import { optionalBoolean } from './validate.js';

/** The risk factors that shorten the recall interval. */
export const RECALL_RISK_FACTORS = [
  'smoker',
  'diabetesPoorlyControlled',
  'periodontitisHistory',
  'priorPeriImplantitis',
] as const;
/** One of {@link RECALL_RISK_FACTORS}. */
export type RecallRiskFactor = (typeof RECALL_RISK_FACTORS)[number];

/** Risk factors that shorten the recall interval. Absent = false. */
export type RecallRisk = Partial<Record<RecallRiskFactor, boolean>>;

/** Practice recall policy, whole months ({@link RECALL_MONTHS_RANGE}). */
export interface RecallPolicy {
  /** Interval without risk factors. Default 6. */
  baseMonths?: number;
  /** Interval with any risk factor. Default 3. */
  riskMonths?: number;
}

/** Default recall interval without risk factors, months [common practice]. */
export const DEFAULT_RECALL_MONTHS = 6;
/** Default recall interval with any risk factor, months [common practice]. */
export const DEFAULT_RISK_RECALL_MONTHS = 3;

/** A policy interval is a whole number of months in this range, inclusive [decision]. */
export const RECALL_MONTHS_RANGE = Object.freeze({ min: 1, max: 60 } as const);

function months(value: number | undefined, fallback: number, field: string): number {
  if (value === undefined) return fallback;
  const { min, max } = RECALL_MONTHS_RANGE;
  if (typeof value !== 'number' || !Number.isInteger(value) || value < min || value > max) {
    throw new ValidationError('out-of-range', `Enter a whole number of months from ${min} to ${max}`, field);
  }
  return value;
}

/** True when any risk factor is present. */
export function hasRecallRisk(risk: RecallRisk): boolean {
  if (risk === null || typeof risk !== 'object')
    throw new ValidationError('bad-value', 'The risk factors are missing', 'risk');
  // Every factor is validated, not only up to the first true one.
  const flags = RECALL_RISK_FACTORS.map((factor) => optionalBoolean(risk[factor], `risk.${factor}`));
  return flags.some(Boolean);
}

/**
 * The recall interval, whole months: `riskMonths` (default 3) when any risk factor is present, else
 * `baseMonths` (default 6).
 * @throws ValidationError for a policy that is not 1–60 whole months, or riskMonths > baseMonths
 */
export function recallIntervalMonths(risk: RecallRisk, policy?: RecallPolicy): number {
  const base = months(policy?.baseMonths, DEFAULT_RECALL_MONTHS, 'policy.baseMonths');
  const riskM = months(policy?.riskMonths, DEFAULT_RISK_RECALL_MONTHS, 'policy.riskMonths');
  if (riskM > base) {
    throw new ValidationError(
      'out-of-range',
      `The interval with risk factors (${riskM} months) cannot be longer than the usual interval (${base} months)`,
      'policy.riskMonths',
    );
  }
  return hasRecallRisk(risk) ? riskM : base;
}

/**
 * Next recall date (YYYY-MM-DD): last exam + {@link recallIntervalMonths}. Pure calendar arithmetic; a day
 * missing in the target month clamps to its last day (31 Aug + 6 months → 28/29 Feb).
 * @throws ValidationError for an impossible date, a policy that is not 1–60 whole months, or riskMonths > baseMonths
 */
export function nextRecallDate(lastExamDate: string, risk: RecallRisk, policy?: RecallPolicy): string {
  return addCalendarMonths(lastExamDate, recallIntervalMonths(risk, policy), 'lastExamDate');
}
