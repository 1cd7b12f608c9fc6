// One definition of "the part is in the mouth", for the Stack and every query that needs the parts
// in place: not removed, and not entered in error by an amendment of the insert change that fitted it.
// A part entered in error was never fitted: no read may take it for a part in the mouth, now or in the
// past (lot look-up, summaries, exports). Only the Timeline shows it, marked, with the amendment's
// reason. `parts-in-place.spec.ts` checks every query of component_instances says which it reads.
import { and, isNull, sql, type SQL } from 'drizzle-orm';
import { componentInstances } from './schema/index.js';

/** Fitted and not removed since (the Stack). */
export const partInPlace = () => and(isNull(componentInstances.removedOn), isNull(componentInstances.enteredInErrorAt));

/** Really fitted, whether removed since or not (histories, lot look-up). */
export const partWasFitted = () => isNull(componentInstances.enteredInErrorAt);

/** `partInPlace` in hand-written SQL, for component_instances under the alias given. */
export const partInPlaceSql = (alias: string): SQL =>
  sql.raw(`${alias}.removed_on is null and ${alias}.entered_in_error_at is null`);

/** `partWasFitted` in hand-written SQL, for component_instances under the alias given. */
export const partWasFittedSql = (alias: string): SQL => sql.raw(`${alias}.entered_in_error_at is null`);
