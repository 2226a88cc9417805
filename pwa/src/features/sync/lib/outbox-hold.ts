/**
 * Why an outbox entry has not gone to the server yet, in the words of the sync page. The rules
 * follow the sync engine (lib/sync-engine.ts): it pushes only for owners and editors, only with a
 * live sign-in and a network, holds back every entity that has an open conflict, replays an
 * interrupted batch under the same id, and retries after a failure with a growing pause.
 */
import type { OutboxEntry, ProjectRole } from '../../../lib/db.js';

export type OutboxEntryState = 'sending' | 'waiting' | 'refused';

export interface OutboxHold {
  state: OutboxEntryState;
  /** True when the entry cannot go out until something else changes (a sign-in, a choice, a role). */
  held: boolean;
  reason: string;
}

export interface OutboxContext {
  /** Entity ids with an open conflict (held back until the user chooses on the sync page). */
  conflictIds: ReadonlySet<string>;
  /** This account's role per server project, as last seen. */
  roles: ReadonlyMap<string, ProjectRole>;
  signedIn: boolean;
  /** The refresh token is still valid (false after the server refused it). */
  canReach: boolean;
  online: boolean;
  engineRunning: boolean;
  lastError: string | null;
}

export function outboxHold(entry: Pick<OutboxEntry, 'projectId' | 'entityId' | 'batchId' | 'error'>, ctx: OutboxContext): OutboxHold {
  if (entry.error) return { state: 'refused', held: true, reason: entry.error };
  if (ctx.conflictIds.has(entry.entityId)) {
    return { state: 'waiting', held: true, reason: 'a conflict on this item needs your choice (see Conflicts above)' };
  }
  if (!ctx.signedIn) return { state: 'waiting', held: true, reason: 'for a sign-in: nobody is signed in on this device' };
  if (!ctx.canReach) return { state: 'waiting', held: true, reason: 'for a sign-in: the sign-in on this device has ended; sign in again' };
  const role = ctx.roles.get(entry.projectId);
  if (role === undefined) {
    return { state: 'waiting', held: true, reason: 'the signed-in account is not a member of this project (another account made the change, or the membership ended)' };
  }
  if (role !== 'owner' && role !== 'editor') {
    return { state: 'waiting', held: true, reason: `your role in this project (${role}) cannot push changes; an owner can make you an editor` };
  }
  if (!ctx.online) return { state: 'waiting', held: true, reason: 'for the network: goes out when this device is back online' };
  if (entry.batchId) {
    return { state: 'sending', held: false, reason: ctx.engineRunning ? 'sending now' : 'sent once without an answer; it is replayed with the same batch id, so the server stores it once' };
  }
  if (ctx.engineRunning) return { state: 'waiting', held: false, reason: 'in the current sync round' };
  if (ctx.lastError) return { state: 'waiting', held: false, reason: `the last attempt failed (${ctx.lastError.replace(/\.$/, '')}); retried automatically` };
  return { state: 'waiting', held: false, reason: 'goes out with the next sync round' };
}
