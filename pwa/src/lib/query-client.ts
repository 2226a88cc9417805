import { QueryClient } from '@tanstack/react-query';

/** Builds the app's QueryClient; tests build their own with the same defaults. */
export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        // Server data is a convenience for an offline-first app: fail fast, show it, move on.
        retry: 1,
        refetchOnWindowFocus: true,
      },
    },
  });
}

export const queryClient = createQueryClient();
