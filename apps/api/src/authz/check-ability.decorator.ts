import { SetMetadata } from '@nestjs/common';
import type { Action, Subject } from '@torquetrail/authz';

export const ABILITY_CHECK = 'torquetrail:abilityCheck';

export type AbilityCheck = { action: Action; subject: Subject } | { signedInOnly: true };

/**
 * Every non-public route states what it needs: `@Allow('read', 'Patient')`. The ability guard
 * refuses a route that states nothing, so forgetting the decorator closes the route.
 */
export function Allow(action: Action, subject: Subject) {
  return SetMetadata(ABILITY_CHECK, { action, subject } satisfies AbilityCheck);
}

/** For the few routes any signed-in user may call about themselves (e.g. who am I). */
Allow.signedIn = () => SetMetadata(ABILITY_CHECK, { signedInOnly: true } satisfies AbilityCheck);
