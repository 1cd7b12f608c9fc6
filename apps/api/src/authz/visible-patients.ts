import { eq, inArray, or, sql, type SQL } from 'drizzle-orm';
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

/**
 * The same scope for a prepared statement: the practice and the shared patients as the
 * placeholders `practiceId` and `sharedPatientIds` (an array, possibly empty), whose values
 * `scopeParams` gives. One statement text serves every user, so it is planned once.
 */
export function visiblePatientsPrepared(): SQL {
  return sql`(${patients.practiceId} = ${sql.placeholder('practiceId')} or ${patients.id} = any(${sql.placeholder('sharedPatientIds')}::uuid[]))`;
}

export const scopeParams = (scope: Scope) => ({
  practiceId: scope.practiceId,
  sharedPatientIds: [...scope.sharedPatientIds],
});
