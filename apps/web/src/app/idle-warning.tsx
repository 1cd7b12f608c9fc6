import { Button, Dialog, DialogBody, DialogFooter } from '@blueprintjs/core';

/** The idle sign-out's countdown (idle-sign-out.tsx); the default export, for `lazy`. */
export default function IdleWarning({
  minutes,
  secondsLeft,
  onStay,
}: {
  minutes: number;
  secondsLeft: number;
  onStay: () => void;
}) {
  return (
    <Dialog
      isOpen
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
      <DialogFooter actions={<Button intent="primary" text="Stay signed in" autoFocus onClick={onStay} />} />
    </Dialog>
  );
}
