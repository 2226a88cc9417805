import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { queryClient as appQueryClient } from '../lib/query-client.js';

/** App-wide providers. Tests pass their own QueryClient. */
export function AppProvider({ children, client = appQueryClient }: { children: ReactNode; client?: QueryClient }) {
  return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}
