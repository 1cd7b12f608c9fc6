/**
 * Implant survival (Kaplan–Meier product-limit estimate) and event rates per 100 implant-years,
 * for the outcomes view. Pure: the API collects follow-up times and events, these functions
 * count. Sources and decisions: docs/clinical-rules.md §11.
 */
import { daysBetween } from './calendar.js';
import { ValidationError } from './errors.js';

/** One subject: time from the start (placement) to the event or to the end of follow-up. */
export interface SurvivalObservation {
  /** Follow-up time, ≥ 0, in any unit (the API uses years). */
  time: number;
  /** True when the event (implant lost) ended the follow-up; false when censored. */
  event: boolean;
}

/** One distinct time at which something happened (an event, a censoring, or both). */
export interface KaplanMeierStep {
  time: number;
  /** nᵢ: subjects still followed just before this time. */
  atRisk: number;
  /** dᵢ: events at this time. */
  events: number;
  /** Subjects censored at this time (counted in `atRisk` of this time, gone afterwards). */
  censored: number;
  /** S(t) just after this time. */
  survival: number;
  /** Greenwood standard error of S(t); null once S(t) reaches 0, where the formula divides by 0. */
  standardError: number | null;
}

export interface KaplanMeierResult {
  subjects: number;
  events: number;
  /** In time order; survival changes only at rows with events. */
  steps: KaplanMeierStep[];
}

/**
 * Product-limit estimate S(t) = ∏ (1 − dᵢ ÷ nᵢ) over event times tᵢ ≤ t (Kaplan & Meier 1958), with
 * Greenwood's SE = S(t) × √Σ dᵢ ÷ (nᵢ (nᵢ − dᵢ)). A subject censored at an event's time is still at
 * risk at that event. Throws `ValidationError` for an empty list or a negative or non-finite time.
 */
export function kaplanMeier(observations: readonly SurvivalObservation[]): KaplanMeierResult {
  if (observations.length === 0) throw new ValidationError('empty', 'no observations to estimate from', 'observations');
  observations.forEach((o, i) => {
    if (!Number.isFinite(o.time))
      throw new ValidationError('not-a-number', 'time must be a number', `observations[${i}].time`);
    if (o.time < 0) throw new ValidationError('out-of-range', 'time must not be negative', `observations[${i}].time`);
  });
  const byTime = new Map<number, { events: number; censored: number }>();
  for (const o of observations) {
    const tally = byTime.get(o.time) ?? { events: 0, censored: 0 };
    if (o.event) tally.events += 1;
    else tally.censored += 1;
    byTime.set(o.time, tally);
  }
  const steps: KaplanMeierStep[] = [];
  let atRisk = observations.length;
  let survival = 1;
  let greenwoodSum = 0;
  let events = 0;
  for (const time of [...byTime.keys()].sort((a, b) => a - b)) {
    const tally = byTime.get(time)!;
    if (tally.events > 0) {
      survival *= 1 - tally.events / atRisk;
      if (atRisk > tally.events) greenwoodSum += tally.events / (atRisk * (atRisk - tally.events));
      events += tally.events;
    }
    steps.push({
      time,
      atRisk,
      events: tally.events,
      censored: tally.censored,
      survival,
      standardError: survival > 0 ? survival * Math.sqrt(greenwoodSum) : null,
    });
    atRisk -= tally.events + tally.censored;
  }
  return { subjects: observations.length, events, steps };
}

/** S(t) read off an estimate: 1 before the first event, the last step at or before `t` afterwards. */
export function survivalAt(result: KaplanMeierResult, t: number): number {
  let survival = 1;
  for (const step of result.steps) {
    if (step.time > t) break;
    survival = step.survival;
  }
  return survival;
}

/** Subjects still followed at time `t` (time ≥ t): the "number at risk" printed under a curve's axis. */
export function numberAtRisk(observations: readonly SurvivalObservation[], t: number): number {
  return observations.filter((o) => o.time >= t).length;
}

/** Days in a Julian year: follow-up in years is days ÷ 365.25 [decision]. */
export const DAYS_PER_YEAR = 365.25;

/** Follow-up in years between two YYYY-MM-DD dates (days ÷ 365.25); `to` before `from` is an error. */
export function followUpYears(from: string, to: string): number {
  const days = daysBetween(from, to);
  if (days < 0) throw new ValidationError('out-of-range', `${to} is before ${from}`, 'to');
  return days / DAYS_PER_YEAR;
}

/**
 * Events per 100 implant-years = events ÷ (sum of follow-up years) × 100 (the way reviews of implant
 * prosthodontics report complications). Throws for a negative or fractional count or no follow-up.
 */
export function eventsPer100ImplantYears(events: number, implantYears: number): number {
  if (!Number.isInteger(events) || events < 0)
    throw new ValidationError('out-of-range', 'events must be a whole number ≥ 0', 'events');
  if (!Number.isFinite(implantYears))
    throw new ValidationError('not-a-number', 'implant-years must be a number', 'implantYears');
  if (implantYears <= 0) throw new ValidationError('out-of-range', 'implant-years must be above 0', 'implantYears');
  return (events / implantYears) * 100;
}
