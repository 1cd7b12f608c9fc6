import { OverlaysProvider, PortalProvider } from '@blueprintjs/core';
import { type QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { type ReactNode, useState } from 'react';
import { createQueryClient } from './query-client';

/**
 * Blueprint's portal and overlay contexts (what `BlueprintProvider` gives, less its hotkeys
 * provider: the app binds no Blueprint hotkeys, and that provider brings its dialog into every
 * page's first load). `client`: the app's query cache when the router's loaders share it
 * (main.tsx); else a new one.
 */
export function Providers({ children, client }: { children: ReactNode; client?: QueryClient }) {
  const [queryClient] = useState(() => client ?? createQueryClient());
  return (
    <PortalProvider>
      <OverlaysProvider>
        <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>
      </OverlaysProvider>
    </PortalProvider>
  );
}
