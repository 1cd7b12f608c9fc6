import { Button, Callout } from '@blueprintjs/core';
import type { ReactNode } from 'react';
import { isApiError } from '../api-client';

interface ErrorStateProps {
  title: string;
  error: unknown;
  onRetry: () => void;
  /** Shown beside the Retry button, e.g. a way back. */
  children?: ReactNode;
}

/** A failed load: the reply's own message and a Retry button. */
export function ErrorState({ title, error, onRetry, children }: ErrorStateProps) {
  const message = isApiError(error) || error instanceof Error ? error.message : 'Something went wrong.';
  return (
    <Callout intent="danger" title={title} icon="error" className="error-state" role="alert">
      <p>{message}</p>
      <div className="error-state__actions">
        <Button text="Retry" icon="refresh" onClick={onRetry} />
        {children}
      </div>
    </Callout>
  );
}
