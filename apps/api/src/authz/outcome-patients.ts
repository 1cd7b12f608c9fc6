import type { SessionUser } from '../auth/session-user.js';
import { scopeOf, siteLimitsOf, type Scope } from './scope.js';

/**
 * The one answer to "whose implants does this user's outcomes view count": the practice's own
 * patients, and for a surgeon also the patients of other practices shared with them under a live
 * share with the `outcomes` scope (a placement-only share does not open how the implants do), and
 * of those only the sites such a share opens: the curves and rates count no other site.
 */
export function outcomePatients(user: SessionUser): Scope {
  const scope = scopeOf(user);
  if (user.role !== 'surgeon') return scope;
  const outcomeShares = user.shares.filter((s) => s.scopes.includes('outcomes'));
  const withOutcomes = new Set(outcomeShares.map((s) => s.patientId));
  return {
    ...scope,
    sharedPatientIds: scope.sharedPatientIds.filter((id) => withOutcomes.has(id)),
    siteLimits: siteLimitsOf(outcomeShares),
  };
}
