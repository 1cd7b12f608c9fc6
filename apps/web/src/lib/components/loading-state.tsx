import { Spinner } from '@blueprintjs/core';

/** A centred spinner that also tells screen readers what is loading. */
export function LoadingState({ label }: { label: string }) {
  return (
    <div className="loading-state" role="status" aria-live="polite">
      <Spinner size={40} aria-hidden="true" />
      <span className="visually-hidden">{label}</span>
    </div>
  );
}
