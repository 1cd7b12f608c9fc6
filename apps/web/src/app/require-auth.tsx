import { defineAbilityFor } from '@torquetrail/authz';
import { useMemo } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import { useMe, useSignOut } from '../features/auth';
import { AppAbilityProvider } from '../lib/ability';
import { ErrorState } from '../lib/components/error-state';
import { LoadingState } from '../lib/components/loading-state';
import { signInPath } from '../lib/return-path';
import { AppShell } from './app-shell';

/**
 * The auth gate around every signed-in page: a spinner while `me` loads, the sign-in page
 * (remembering the wanted page) when nobody is signed in, else the shell with the user's ability.
 */
export function RequireAuth() {
  const me = useMe();
  const location = useLocation();
  // Owned here, not in the shell, so the gate knows a missing user means "signed out on purpose"
  // (plain /sign-in) rather than "session lost" (come back here after signing in).
  const signOut = useSignOut();
  const ability = useMemo(() => (me.data ? defineAbilityFor(me.data) : null), [me.data]);

  if (me.isPending) return <LoadingState label="Checking your session" />;
  if (me.isError) {
    return (
      <main className="page" id="main">
        <ErrorState title="Could not check your session" error={me.error} onRetry={() => void me.refetch()} />
      </main>
    );
  }
  if (!me.data || !ability) {
    const target = signOut.isIdle ? signInPath(location.pathname + location.search) : '/sign-in';
    return <Navigate to={target} replace />;
  }
  return (
    <AppAbilityProvider ability={ability}>
      <AppShell
        me={me.data}
        onSignOut={() => signOut.mutate()}
        signingOut={signOut.isPending}
        signOutError={signOut.error}
      />
    </AppAbilityProvider>
  );
}
