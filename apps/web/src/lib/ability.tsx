import { AbilityProvider, Can as CaslCan, type CanProps, useAbility } from '@casl/react';
import type { AppAbility } from '@torquetrail/authz';
import type { ReactNode } from 'react';

/**
 * The signed-in user's CASL ability, built from the same `defineAbilityFor` as the API's guard.
 * @casl/react 7 replaced `createContextualCan` with `AbilityProvider` + a context-reading `<Can>`;
 * these wrappers pin the ability type so `<Can I="create" a="TorqueEvent">` is checked.
 */
export function AppAbilityProvider({ ability, children }: { ability: AppAbility; children: ReactNode }) {
  return <AbilityProvider value={ability}>{children}</AbilityProvider>;
}

/** Renders its children only when the signed-in user may do the action. Hides, never disables. */
export function Can(props: CanProps<AppAbility>) {
  return <CaslCan<AppAbility> {...props} />;
}

export function useAppAbility(): AppAbility {
  return useAbility<AppAbility>();
}
