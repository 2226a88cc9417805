/**
 * What the "new version" prompt says and offers, from the service worker's and the sync engine's
 * state. Reloading never loses local work: the outbox, conflicts and cursors live in IndexedDB
 * (Dexie), and a push cut off mid-way is replayed with the same batch id. Waiting for a running
 * sync only spares the server a replay and the user a moment of "Not synced".
 */
import type { SyncPhase, SyncStatus } from '../hooks/use-sync-status.js';

export interface UpdatePromptInput {
  /** A new service-worker version is installed and waiting. */
  needRefresh: boolean;
  /** The sync state of the header badge (undefined while it loads). */
  sync: Pick<SyncStatus, 'phase' | 'waiting'> | undefined;
  /** The user chose "Reload when synced" and a sync round is under way for it. */
  reloadPending: boolean;
}

export type UpdatePromptKind =
  /** Nothing to say. */
  | 'hidden'
  /** Nothing waits and no sync runs: reload now. */
  | 'ready'
  /** A sync runs, or changes wait and can be sent now: offer to reload once they are sent. */
  | 'busy'
  /** Changes wait but cannot be sent now (offline, signed out, conflicts, refused): reload is safe, they stay. */
  | 'held'
  /** The user asked to reload after the sync; it runs. */
  | 'pending';

export interface UpdatePrompt {
  kind: UpdatePromptKind;
  title: string;
  body: string;
  /** Changes of server projects in the outbox. */
  waiting: number;
}

/** Phases in which waiting changes cannot go out right now. */
const HELD_PHASES: ReadonlySet<SyncPhase> = new Set(['sign-in', 'offline', 'conflict', 'refused', 'error', 'local']);

const KEPT = 'Nothing is lost by reloading: changes waiting to be pushed are kept in this browser’s database and go out after the reload.';

function changes(n: number): string {
  return `${n} change${n === 1 ? '' : 's'}`;
}

export function updatePrompt({ needRefresh, sync, reloadPending }: UpdatePromptInput): UpdatePrompt {
  const waiting = sync?.waiting ?? 0;
  if (!needRefresh) return { kind: 'hidden', title: '', body: '', waiting };
  const title = 'A new version of Phasewright is ready';
  if (reloadPending) {
    return { kind: 'pending', title, body: `Reloading as soon as the sync has finished${waiting ? ` (${changes(waiting)} to push)` : ''}. ${KEPT}`, waiting };
  }
  const phase = sync?.phase;
  if (phase === 'syncing') {
    return { kind: 'busy', title, body: `A sync is running${waiting ? ` (${changes(waiting)} to push)` : ''}. Reload when it has finished, or now. ${KEPT}`, waiting };
  }
  if (waiting > 0 && phase !== undefined && !HELD_PHASES.has(phase)) {
    return { kind: 'busy', title, body: `${changes(waiting)} ${waiting === 1 ? 'waits' : 'wait'} to be pushed. Reload once ${waiting === 1 ? 'it is' : 'they are'} sent, or now. ${KEPT}`, waiting };
  }
  if (waiting > 0) {
    const why = phase === 'offline' ? 'this device is offline' : phase === 'sign-in' || phase === 'local' ? 'a sign-in is needed' : phase === 'conflict' ? 'conflicts wait for you on the sync page' : 'the last sync did not go through';
    return { kind: 'held', title, body: `${changes(waiting)} cannot be pushed now (${why}). ${KEPT}`, waiting };
  }
  return { kind: 'ready', title, body: 'Reload to use it. A sweep running in this tab stops with the reload; its points so far are stored, and running it again fills the gaps.', waiting };
}

/**
 * "Reload when synced": one sync round (it pushes what can go out), then the reload that activates
 * the waiting service worker. A failed round does not block the reload: nothing in the outbox is lost.
 */
export async function reloadAfterSync(deps: { sync: () => Promise<void>; reload: () => Promise<void> }): Promise<void> {
  try {
    await deps.sync();
  } finally {
    await deps.reload();
  }
}
