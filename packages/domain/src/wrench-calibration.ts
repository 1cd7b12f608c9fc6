/**
 * When a torque wrench's calibration is overdue.
 *
 * The interval is the practice's own (a setting). Without one, 12 months [common practice]: the
 * yearly interval is what torque-tool makers and calibration laboratories usually quote, commonly
 * attributed to ISO 6789-1:2017 for users without their own control procedure; the standard's own
 * text could not be checked here (it is not openly published), so the default is not marked [pub].
 *
 * Decision: a wrench with no calibration recorded counts as overdue — nothing shows it is in
 * calibration [decision].
 */
import { addCalendarMonths, isValidIsoDate } from './calendar.js';
import { ValidationError } from './errors.js';

/** The default calibration interval, months [common practice]. */
export const DEFAULT_CALIBRATION_INTERVAL_MONTHS = 12;
/** The interval a practice may set, months, inclusive [decision]. */
export const CALIBRATION_INTERVAL_RANGE = Object.freeze({ min: 1, max: 60 } as const);

/** The day a calibration on `calibratedOn` (YYYY-MM-DD) runs out: the same day `intervalMonths` later. */
export function calibrationDueOn(calibratedOn: string, intervalMonths: number): string {
  if (
    !Number.isInteger(intervalMonths) ||
    intervalMonths < CALIBRATION_INTERVAL_RANGE.min ||
    intervalMonths > CALIBRATION_INTERVAL_RANGE.max
  )
    throw new ValidationError(
      'out-of-range',
      `The calibration interval is a whole number of months from ${CALIBRATION_INTERVAL_RANGE.min} to ${CALIBRATION_INTERVAL_RANGE.max}`,
      'intervalMonths',
    );
  return addCalendarMonths(calibratedOn, intervalMonths, 'calibratedOn');
}

/**
 * Whether a wrench whose latest calibration was on `lastCalibratedOn` (null: none recorded) is
 * overdue on `day` (YYYY-MM-DD): from the due day on, or always without a calibration.
 */
export function calibrationOverdue(lastCalibratedOn: string | null, intervalMonths: number, day: string): boolean {
  if (!isValidIsoDate(day)) throw new ValidationError('bad-date', 'Enter the day as YYYY-MM-DD', 'day');
  if (lastCalibratedOn === null) return true;
  return day >= calibrationDueOn(lastCalibratedOn, intervalMonths);
}
