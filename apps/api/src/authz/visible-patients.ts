import { eq, inArray, or, type SQL } from 'drizzle-orm';
import { patients } from '../db/schema/index.js';
import type { Scope } from './scope.js';

/**
 * Patients of the user's practice, plus patients of other practices shared with them: the
 * `where` fragment every repository joins `patients` on, so a row outside the scope is never loaded.
 */
export function visiblePatients(scope: Scope): SQL {
  const own = eq(patients.practiceId, scope.practiceId);
  return scope.sharedPatientIds.length > 0 ? or(own, inArray(patients.id, [...scope.sharedPatientIds]))! : own;
}
