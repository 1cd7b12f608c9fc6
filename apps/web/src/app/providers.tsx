import { BlueprintProvider } from '@blueprintjs/core';
import { QueryClientProvider } from '@tanstack/react-query';
import { type ReactNode, useState } from 'react';
import { createQueryClient } from './query-client';

export function Providers({ children }: { children: ReactNode }) {
  const [queryClient] = useState(createQueryClient);
  return (
    <BlueprintProvider>
      <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>
    </BlueprintProvider>
  );
}
