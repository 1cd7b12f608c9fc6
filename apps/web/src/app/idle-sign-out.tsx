import type { Me } from '@torquetrail/contracts';
import { lazy, Suspense, useEffect, useRef, useState } from 'react';

/** Activity in any tab of the app counts: sign-out ends every session of the user, all tabs included. */
const LAST_ACTIVITY_KEY = 'tt-last-activity';
const ACTIVITY_EVENTS = ['pointerdown', 'keydown', 'wheel', 'touchstart'] as const;

// The dialog (Blueprint's overlay and its transitions) is a chunk of its own: no page's first view
// waits for it. It is fetched a little after the app has shown, so it is there when needed.
const loadWarning = () => import('./idle-warning');
const IdleWarning = lazy(loadWarning);
const PREFETCH_WARNING_AFTER_MS = 10_000;

const storedActivity = (): number => Number(localStorage.getItem(LAST_ACTIVITY_KEY) ?? 0) || 0;

/**
 * Automatic logoff (HIPAA 45 CFR 164.312(a)(2)(iii)): after the practice's idle period without a
 * key, click, touch or scroll in any tab, `onIdle` signs out. `session.warnBeforeS` before that, a
 * dialog counts down and offers to stay signed in. Moving the mouse alone does not count.
 */
export function IdleSignOut({
  session,
  onIdle,
  onStay,
}: {
  session: Me['session'];
  onIdle: () => void;
  onStay: () => void;
}) {
  const last = useRef(0);
  const [secondsLeft, setSecondsLeft] = useState<number | null>(null);
  const fired = useRef(false);

  useEffect(() => {
    const prefetch = window.setTimeout(() => void loadWarning().catch(() => undefined), PREFETCH_WARNING_AFTER_MS);
    return () => window.clearTimeout(prefetch);
  }, []);

  useEffect(() => {
    let written = 0;
    const mark = () => {
      last.current = Date.now();
      // Shared with the other tabs, at most every few seconds.
      if (last.current - written > 5000) {
        written = last.current;
        localStorage.setItem(LAST_ACTIVITY_KEY, String(last.current));
      }
    };
    mark();
    for (const name of ACTIVITY_EVENTS) window.addEventListener(name, mark, { passive: true, capture: true });
    const timer = window.setInterval(() => {
      const lastAny = Math.max(last.current, storedActivity());
      const left = session.idleSignOutS - (Date.now() - lastAny) / 1000;
      if (left <= 0) {
        if (!fired.current) {
          fired.current = true;
          onIdle();
        }
        return;
      }
      setSecondsLeft(left <= session.warnBeforeS ? Math.ceil(left) : null);
    }, 1000);
    return () => {
      window.clearInterval(timer);
      for (const name of ACTIVITY_EVENTS) window.removeEventListener(name, mark, { capture: true });
    };
  }, [session.idleSignOutS, session.warnBeforeS, onIdle]);

  const minutes = Math.round(session.idleSignOutS / 60);
  if (secondsLeft === null) return null;
  return (
    <Suspense fallback={null}>
      <IdleWarning
        minutes={minutes}
        secondsLeft={secondsLeft}
        onStay={() => {
          last.current = Date.now();
          localStorage.setItem(LAST_ACTIVITY_KEY, String(last.current));
          setSecondsLeft(null);
          onStay();
        }}
      />
    </Suspense>
  );
}
