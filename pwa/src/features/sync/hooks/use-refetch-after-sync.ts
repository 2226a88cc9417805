import { useEffect, useRef, useSyncExternalStore } from 'react';
import { engineState, subscribeEngine } from '../../../lib/sync-engine.js';

/**
 * Calls `refetch` after every finished sync round (not on mount) while `enabled`: for server data
 * that a push or pull may just have changed, such as whether a review verdict is outdated.
 */
export function useRefetchAfterSync(refetch: () => unknown, enabled: boolean): void {
  const { lastSyncAt } = useSyncExternalStore(subscribeEngine, engineState, engineState);
  const seenSync = useRef(lastSyncAt);
  useEffect(() => {
    if (lastSyncAt === seenSync.current) return;
    seenSync.current = lastSyncAt;
    if (enabled) void refetch();
  }, [enabled, lastSyncAt, refetch]);
}
