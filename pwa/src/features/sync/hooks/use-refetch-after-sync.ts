import { useEffect, useSyncExternalStore } from 'react';
import type { UseQueryResult } from '@tanstack/react-query';
import { engineState, subscribeEngine } from '../../../lib/sync-engine.js';

/**
 * Reads a query again when a sync round has finished after its data was fetched, while `enabled`:
 * for server data that a push or pull may just have changed, such as whether a review verdict is
 * outdated. This holds on mount too: data cached before a round that ran while the page was not
 * shown (say, new points pushed from the sweep page) is not trusted just because it is younger
 * than the query's stale time.
 */
export function useRefetchAfterSync(query: Pick<UseQueryResult, 'refetch' | 'dataUpdatedAt' | 'errorUpdatedAt' | 'isFetching'>, enabled: boolean): void {
  const { lastSyncAt } = useSyncExternalStore(subscribeEngine, engineState, engineState);
  const { refetch, isFetching } = query;
  // A failed read counts as a read: a query that cannot reach the server is not retried in a loop.
  const readAt = Math.max(query.dataUpdatedAt, query.errorUpdatedAt);
  useEffect(() => {
    // Never read yet: the query's own first fetch is under way or waiting to be enabled.
    if (!enabled || isFetching || lastSyncAt === null || readAt === 0) return;
    if (lastSyncAt > readAt) void refetch();
  }, [enabled, isFetching, lastSyncAt, readAt, refetch]);
}
