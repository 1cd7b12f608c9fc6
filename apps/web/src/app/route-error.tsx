import { Button, Callout } from '@blueprintjs/core';
import { useRouteError } from 'react-router-dom';

/** Last resort for a render error: say so and offer a reload, instead of a blank page. */
export function RouteError() {
  // React Router reports the error in the browser console itself.
  const error = useRouteError();
  return (
    <main className="page" id="main">
      <Callout intent="danger" title="This page could not be shown" icon="error" role="alert">
        <p>{error instanceof Error ? error.message : 'An unexpected error occurred.'}</p>
        <Button text="Reload" icon="refresh" onClick={() => window.location.reload()} />
      </Callout>
    </main>
  );
}
