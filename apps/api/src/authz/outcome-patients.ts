import type { SessionUser } from '../auth/session-user.js';
import { scopeOf, type Scope } from './scope.js';

/**
 * The one answer to "whose implants does this user's outcomes view count": the practice's own
 * patients, and for a surgeon also the patients of other practices shared with them under a live
 * share with the `outcomes` scope (a placement-only share does not open how the implants do).
 */
export function outcomePatients(user: SessionUser): Scope {
  const scope = scopeOf(user);
  if (user.role !== 'surgeon') return scope;
  const withOutcomes = new Set(user.shares.filter((s) => s.scopes.includes('outcomes')).map((s) => s.patientId));
  return { ...scope, sharedPatientIds: scope.sharedPatientIds.filter((id) => withOutcomes.has(id)) };
}
