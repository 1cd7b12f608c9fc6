import { BlueprintProvider } from '@blueprintjs/core';
import { type QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { type ReactNode, useState } from 'react';
import { createQueryClient } from './query-client';

/** `client`: the app's query cache when the router's loaders share it (main.tsx); else a new one. */
export function Providers({ children, client }: { children: ReactNode; client?: QueryClient }) {
  const [queryClient] = useState(() => client ?? createQueryClient());
  return (
    <BlueprintProvider>
      <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>
    </BlueprintProvider>
  );
}
