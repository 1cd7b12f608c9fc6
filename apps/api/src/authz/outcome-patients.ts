import type { SessionUser } from '../auth/session-user.js';
import { scopeOf, type Scope } from './scope.js';

/**
 * The one answer to "whose implants does this user's outcomes view count": the practice's own
 * patients, and for a surgeon also the patients of other practices shared with them. Today any
 * active share counts; when shares carry scopes, only a share with the `outcomes` scope should,
 * and this is the place to narrow it (the outcomes view and the referral summary ask here).
 */
export function outcomePatients(user: SessionUser): Scope {
  return scopeOf(user);
}
