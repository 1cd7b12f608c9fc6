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

/** Risk factors that shorten the recall interval. Absent = false. */
export interface RecallRisk {
  smoker?: boolean;
  diabetesPoorlyControlled?: boolean;
  periodontitisHistory?: boolean;
  priorPeriImplantitis?: boolean;
}

/** Practice recall policy, whole months (1–60). */
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

function months(value: number | undefined, fallback: number, field: string): number {
  if (value === undefined) return fallback;
  if (typeof value !== 'number' || !Number.isInteger(value) || value < 1 || value > 60) {
    throw new ValidationError('out-of-range', `${field} must be a whole number of months from 1 to 60 (got ${String(value)})`, field);
  }
  return value;
}

/** True when any risk factor is present. */
export function hasRecallRisk(risk: RecallRisk): boolean {
  if (risk === null || typeof risk !== 'object') throw new ValidationError('bad-value', 'risk must be an object', 'risk');
  const flags = [
    optionalBoolean(risk.smoker, 'risk.smoker'),
    optionalBoolean(risk.diabetesPoorlyControlled, 'risk.diabetesPoorlyControlled'),
    optionalBoolean(risk.periodontitisHistory, 'risk.periodontitisHistory'),
    optionalBoolean(risk.priorPeriImplantitis, 'risk.priorPeriImplantitis'),
  ];
  return flags.some(Boolean);
}

/**
 * Next recall date (YYYY-MM-DD): last exam + `baseMonths` (default 6), or + `riskMonths` (default 3) when
 * any risk factor is present. Pure calendar arithmetic; a day missing in the target month clamps to its
 * last day (31 Aug + 6 months → 28/29 Feb).
 * @throws ValidationError for an impossible date, a policy that is not 1–60 whole months, or riskMonths > baseMonths
 */
export function nextRecallDate(lastExamDate: string, risk: RecallRisk, policy?: RecallPolicy): string {
  const base = months(policy?.baseMonths, DEFAULT_RECALL_MONTHS, 'policy.baseMonths');
  const riskM = months(policy?.riskMonths, DEFAULT_RISK_RECALL_MONTHS, 'policy.riskMonths');
  if (riskM > base) {
    throw new ValidationError('out-of-range', `policy.riskMonths (${riskM}) must not exceed policy.baseMonths (${base})`, 'policy.riskMonths');
  }
  return addCalendarMonths(lastExamDate, hasRecallRisk(risk) ? riskM : base, 'lastExamDate');
}
