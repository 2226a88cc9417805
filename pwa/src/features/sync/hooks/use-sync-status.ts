import { useLiveQuery } from 'dexie-react-hooks';
import { useSyncExternalStore } from 'react';
import { LOCAL_PROJECT_ID, db } from '../../../lib/db.js';
import { engineState, subscribeEngine } from '../../../lib/sync-engine.js';
import { useOnlineStatus } from '../../../lib/use-online-status.js';

export type SyncPhase = 'local' | 'sign-in' | 'offline' | 'syncing' | 'conflict' | 'refused' | 'error' | 'waiting' | 'up-to-date';

export interface SyncStatus {
  phase: SyncPhase;
  /** Outbox entries of server projects waiting to be pushed. */
  waiting: number;
  conflicts: number;
  refused: number;
  lastError: string | null;
  lastSyncAt: number | null;
}

/** The one sync state the header and the sync page show. */
export function useSyncStatus(): SyncStatus | undefined {
  const online = useOnlineStatus();
  const engine = useSyncExternalStore(subscribeEngine, engineState, engineState);
  const counts = useLiveQuery(async () => {
    const session = await db.session.get('current');
    const entries = await db.outbox.where('projectId').notEqual(LOCAL_PROJECT_ID).toArray();
    return {
      signedIn: !!session,
      canReach: !!session?.refreshToken,
      waiting: entries.filter((e) => !e.error).length,
      refused: entries.filter((e) => e.error).length,
      conflicts: await db.conflicts.count(),
    };
  }, []);
  if (!counts) return undefined;
  const base = { waiting: counts.waiting, conflicts: counts.conflicts, refused: counts.refused, lastError: engine.lastError, lastSyncAt: engine.lastSyncAt };
  let phase: SyncPhase;
  if (!counts.signedIn) phase = 'local';
  else if (!counts.canReach || engine.needsSignIn) phase = 'sign-in';
  else if (counts.conflicts > 0) phase = 'conflict';
  else if (!online) phase = 'offline';
  else if (engine.running) phase = 'syncing';
  else if (counts.refused > 0) phase = 'refused';
  else if (engine.lastError) phase = 'error';
  else if (counts.waiting > 0) phase = 'waiting';
  else phase = 'up-to-date';
  return { phase, ...base };
}

/** Words for a sync state (the badge and the sync page say the same). */
export function syncStatusText(s: SyncStatus): string {
  const n = (k: number, one: string) => `${k} ${one}${k === 1 ? '' : 's'}`;
  switch (s.phase) {
    case 'local':
      return 'Local only';
    case 'sign-in':
      return 'Sign in to sync';
    case 'conflict':
      return n(s.conflicts, 'conflict');
    case 'offline':
      return s.waiting > 0 ? `Offline · ${s.waiting} waiting` : 'Offline';
    case 'syncing':
      return 'Syncing…';
    case 'refused':
      return `${n(s.refused, 'change')} refused`;
    case 'error':
      return s.waiting > 0 ? `Not synced · ${s.waiting} waiting` : 'Server not reached';
    case 'waiting':
      return `${s.waiting} waiting`;
    case 'up-to-date':
      return 'Up to date';
  }
}
