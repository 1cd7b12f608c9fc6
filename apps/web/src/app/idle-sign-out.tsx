import { Button, Dialog, DialogBody, DialogFooter } from '@blueprintjs/core';
import type { Me } from '@torquetrail/contracts';
import { useEffect, useRef, useState } from 'react';

/** Activity in any tab of the app counts: sign-out ends every session of the user, all tabs included. */
const LAST_ACTIVITY_KEY = 'tt-last-activity';
const ACTIVITY_EVENTS = ['pointerdown', 'keydown', 'wheel', 'touchstart'] as const;

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
  return (
    <Dialog
      isOpen={secondsLeft !== null}
      title="Still there?"
      icon="time"
      isCloseButtonShown={false}
      canEscapeKeyClose={false}
      canOutsideClickClose={false}
    >
      <DialogBody>
        <p role="status" aria-live="polite">
          Torquetrail has not been used for {minutes >= 1 ? `about ${minutes} minutes` : 'a while'}. You will be signed
          out in <strong data-testid="idle-seconds-left">{secondsLeft}</strong> seconds. What you are typing is kept for
          when you sign in again.
        </p>
      </DialogBody>
      <DialogFooter
        actions={
          <Button
            intent="primary"
            text="Stay signed in"
            autoFocus
            onClick={() => {
              last.current = Date.now();
              localStorage.setItem(LAST_ACTIVITY_KEY, String(last.current));
              setSecondsLeft(null);
              onStay();
            }}
          />
        }
      />
    </Dialog>
  );
}
