/**
 * Provisional restorations: one awaiting its definitive restoration is overdue from the day after
 * its planned replacement date [decision: the planned day itself is still on time].
 */
import { isValidIsoDate } from './calendar.js';
import { ValidationError } from './errors.js';

/** True when a provisional planned to be replaced on `plannedReplacementOn` is overdue on `today` (YYYY-MM-DD). */
export function provisionalOverdue(plannedReplacementOn: string, today: string): boolean {
  if (!isValidIsoDate(plannedReplacementOn))
    throw new ValidationError('bad-date', 'Enter a real date', 'plannedReplacementOn');
  if (!isValidIsoDate(today)) throw new ValidationError('bad-date', 'Enter a real date', 'today');
  return plannedReplacementOn < today;
}
