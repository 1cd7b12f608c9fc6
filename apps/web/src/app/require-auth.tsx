import { defineAbilityFor } from '@torquetrail/authz';
import { lazy, useCallback, useMemo, useState } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import { useMe, useSignOut } from '../features/auth';
import { AppAbilityProvider } from '../lib/ability';
import { AfterFirstPaint } from '../lib/components/after-first-paint';
import { ErrorState } from '../lib/components/error-state';
import { LoadingState } from '../lib/components/loading-state';
import { setDateFormat } from '../lib/dates';
import { keepDrafts, setDraftOwner } from '../lib/forms';
import { idleSignInPath, signInPath } from '../lib/return-path';
import { AppShell } from './app-shell';

// The idle sign-out's timers start once the first view has painted (its period is minutes), so
// its code is a chunk of its own, not part of any page's first load.
const IdleSignOut = lazy(async () => ({ default: (await import('./idle-sign-out')).IdleSignOut }));

/**
 * The auth gate around every signed-in page: a spinner while `me` loads, the sign-in page
 * (remembering the wanted page) when nobody is signed in, else the shell with the user's ability
 * and the idle sign-out.
 */
export function RequireAuth() {
  const me = useMe();
  const location = useLocation();
  // Owned here, not in the shell, so the gate knows a missing user means "signed out on purpose"
  // (plain /sign-in) rather than "session lost" (come back here after signing in).
  const signOut = useSignOut();
  const [idleOut, setIdleOut] = useState(false);
  const ability = useMemo(() => (me.data ? defineAbilityFor(me.data) : null), [me.data]);
  const { mutate: endSession } = signOut;
  const { refetch } = me;
  const onIdle = useCallback(() => {
    setIdleOut(true);
    keepDrafts();
    endSession();
  }, [endSession]);
  const onStay = useCallback(() => void refetch(), [refetch]);

  if (me.isPending) return <LoadingState label="Checking your session" />;
  if (me.isError) {
    return (
      <main className="page" id="main">
        <ErrorState title="Could not check your session" error={me.error} onRetry={() => void me.refetch()} />
      </main>
    );
  }
  if (!me.data || !ability) {
    const here = location.pathname + location.search;
    if (idleOut) return <Navigate to={idleSignInPath(here)} replace />;
    // The session ended under the page (elsewhere, or its 12 hours): the forms' values are kept
    // now, while they are still mounted, for after signing in again.
    if (signOut.isIdle) keepDrafts();
    return <Navigate to={signOut.isIdle ? signInPath(here) : '/sign-in'} replace />;
  }
  setDraftOwner(me.data.id);
  // Before any page renders: every date is written and read in the practice's order. A change
  // (a refetched session) remounts the pages, so no screen mixes two formats.
  setDateFormat(me.data.dateFormat);
  return (
    <AppAbilityProvider ability={ability}>
      <AppShell
        key={me.data.dateFormat}
        me={me.data}
        onSignOut={() => signOut.mutate()}
        signingOut={signOut.isPending}
        signOutError={signOut.error}
      />
      <AfterFirstPaint>
        <IdleSignOut session={me.data.session} onIdle={onIdle} onStay={onStay} />
      </AfterFirstPaint>
    </AppAbilityProvider>
  );
}
