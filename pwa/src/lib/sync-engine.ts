/**
 * The sync engine: pushes the Dexie outbox of each server project to the sync server and pulls
 * what changed after the project's cursor, applying it to IndexedDB.
 *
 * - Everything waiting is in Dexie (outbox, conflicts, cursors), never in memory: a reload or a
 *   closed tab mid-sync loses nothing. A push's batch id is written onto its outbox entries
 *   before the request, so a retry after a lost answer replays the same batch (the server
 *   answers a replayed batch id with its first response and changes nothing).
 * - Runs when the browser comes online, shortly after a local change, and on a timer; failures
 *   back off exponentially (5 s · 2^n, at most 5 min).
 * - A stale edit (409) becomes a conflict record; its entity is held back until the user picks
 *   mine, theirs or an edited version on the sync page. A refused batch (400, 413, 403) marks its
 *   entries with the reason and holds them; the user can retry or discard them.
 * - A map the server stored under the id of an existing map with the same identity (`storedAs`)
 *   is re-keyed to that id on this device (lib/rekey-map.ts), so it is not shown twice.
 */
import {
  canonicalJson,
  sha256Hex,
  type MapPoint,
  type MapProvenance,
  type ModelSpec,
  type SweepSpec,
} from '@phasewright/physics-core';
import { liveQuery } from 'dexie';
import { ApiError } from './api-client.js';
import { apiCall, currentSession, SignInRequired, type SessionUser } from './auth.js';
import {
  LOCAL_PROJECT_ID,
  db,
  newId,
  pointRow,
  type ConflictRecord,
  type LabelAnnotation,
  type MapRecord,
  type ModelRecord,
  type OutboxEntry,
  type SweepRecord,
} from './db.js';
import { fetchAndStoreProjects } from './project-store.js';
import { rekeyMap, rekeyTables } from './rekey-map.js';

/** Entries per push batch (records; a map entry counts once, its points travel with it). */
const BATCH_ENTRIES = 100;
/** Points per push request (the server allows 10 000 and 9 MiB; points are ~1–3 kB). */
const POINTS_PER_REQUEST = 1500;
const PULL_PAGE = 2000;
const IDLE_INTERVAL_MS = 20_000;
const BACKOFF_BASE_MS = 5_000;
const BACKOFF_MAX_MS = 300_000;
const CHANGE_DEBOUNCE_MS = 800;

type ServerKind = 'model' | 'sweep' | 'map' | 'points' | 'annotation' | 'note';

interface Change {
  kind: ServerKind;
  id: string;
  baseRevision?: number;
  data: Record<string, unknown>;
}

interface PushResult {
  kind: ServerKind;
  id: string;
  status: 'created' | 'updated' | 'merged' | 'unchanged';
  revision?: number;
  /** Maps: the server already had a map of this identity under this id and merged into it. */
  storedAs?: string;
}

interface PullChange {
  seq: number;
  kind: ServerKind;
  id: string;
  revision?: number;
  data: Record<string, unknown>;
  updatedBy?: string | null;
  updatedAt?: string;
}

interface ServerConflict {
  kind: ServerKind;
  id: string;
  yours: Record<string, unknown>;
  theirs: ConflictRecord['theirs'];
}

const LOCAL_OF: Partial<Record<ServerKind, ConflictRecord['entity']>> = { model: 'model', sweep: 'sweep', annotation: 'label' };

/** Digest of a point set as the server computes it: SHA-256 of sorted lines `key\tsha256(canonical point)\n`. */
export function pointsDigest(points: Record<string, MapPoint>): string {
  const keys = Object.keys(points).sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
  return sha256Hex(keys.map((k) => `${k}\t${sha256Hex(canonicalJson(points[k]))}\n`).join(''));
}

// ---------------------------------------------------------------- building a push

function recordChange(entry: OutboxEntry, record: ModelRecord | SweepRecord | LabelAnnotation | undefined): Change | undefined {
  if (!record) return undefined;
  const baseRevision = record.syncedRev ?? 0;
  if (entry.entity === 'model') {
    const m = record as ModelRecord;
    return { kind: 'model', id: m.id, baseRevision, data: { name: m.name, spec: m.spec } };
  }
  if (entry.entity === 'sweep') {
    const s = record as SweepRecord;
    return { kind: 'sweep', id: s.id, baseRevision, data: { name: s.name, modelId: s.modelId, mapId: s.mapId, spec: s.spec } };
  }
  const a = record as LabelAnnotation;
  return {
    kind: 'annotation',
    id: a.id,
    baseRevision,
    data: { mapId: a.mapId, labelId: a.labelId, ...(a.name ? { name: a.name } : {}), ...(a.color ? { color: a.color } : {}), ...(a.note ? { note: a.note } : {}) },
  };
}

/** A map header (phasewright.map/1 without points) and its points, from Dexie. */
async function mapDocument(mapId: string): Promise<{ header: Record<string, unknown>; points: Record<string, MapPoint> } | undefined> {
  const map = await db.maps.get(mapId);
  if (!map) return undefined;
  const rows = await db.points.where('mapId').equals(mapId).toArray();
  const points: Record<string, MapPoint> = {};
  for (const r of rows) points[r.key] = r.point;
  return { header: { spec: 'phasewright.map/1', id: map.identity, sweep: map.sweep, provenance: map.provenance }, points };
}

// ---------------------------------------------------------------- engine state for the UI

export interface EngineState {
  running: boolean;
  lastError: string | null;
  lastSyncAt: number | null;
  /** Set when the server wants a new sign-in. */
  needsSignIn: boolean;
}

let state: EngineState = { running: false, lastError: null, lastSyncAt: null, needsSignIn: false };
const listeners = new Set<() => void>();
function setState(patch: Partial<EngineState>) {
  state = { ...state, ...patch };
  for (const l of listeners) l();
}
export function subscribeEngine(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}
export function engineState(): EngineState {
  return state;
}

// ---------------------------------------------------------------- push

class Refused extends Error {}

async function post(projectId: string, batchId: string, changes: Change[]): Promise<PushResult[]> {
  const res = await apiCall<{ results: PushResult[] }>(`/api/projects/${encodeURIComponent(projectId)}/sync/push`, { method: 'POST', body: { batchId, changes } });
  return res.results;
}

/** Pushes every waiting entry of one project (batch by batch). */
export async function pushProject(projectId: string): Promise<{ pushed: number; conflicts: number }> {
  let pushed = 0;
  let conflictCount = 0;
  for (let round = 0; round < 1000; round++) {
    const held = new Set((await db.conflicts.where('projectId').equals(projectId).toArray()).map((c) => c.entityId));
    const all = (await db.outbox.where('projectId').equals(projectId).sortBy('seq')).filter((e) => !e.error && !held.has(e.entityId));
    if (all.length === 0) break;
    // A batch interrupted earlier is retried as it was, with the same id.
    const retry = all.find((e) => e.batchId)?.batchId;
    const batch = retry ? all.filter((e) => e.batchId === retry) : all.slice(0, BATCH_ENTRIES);
    const batchId = retry ?? newId();
    if (!retry) await db.outbox.bulkUpdate(batch.map((e) => ({ key: e.seq as number, changes: { batchId } })));

    const seen = new Set<string>();
    const changes: Change[] = [];
    const extraPoints: { mapId: string; points: Record<string, MapPoint> }[] = [];
    for (const e of batch) {
      const key = `${e.entity}:${e.entityId}`;
      if (seen.has(key) || e.op !== 'put') continue;
      seen.add(key);
      if (e.entity === 'map' || e.entity === 'point') {
        const doc = await mapDocument(e.entityId);
        if (!doc) continue;
        const keys = Object.keys(doc.points);
        const first: Record<string, MapPoint> = {};
        for (const k of keys.slice(0, POINTS_PER_REQUEST)) first[k] = doc.points[k];
        changes.push({ kind: 'map', id: e.entityId, data: { ...doc.header, points: first } });
        for (let i = POINTS_PER_REQUEST; i < keys.length; i += POINTS_PER_REQUEST) {
          const chunk: Record<string, MapPoint> = {};
          for (const k of keys.slice(i, i + POINTS_PER_REQUEST)) chunk[k] = doc.points[k];
          extraPoints.push({ mapId: e.entityId, points: chunk });
        }
      } else {
        const table = e.entity === 'model' ? db.models : e.entity === 'sweep' ? db.sweeps : db.labels;
        const change = recordChange(e, await table.get(e.entityId));
        if (change) changes.push(change);
      }
    }

    try {
      const results = changes.length > 0 ? await post(projectId, batchId, changes) : [];
      // Points beyond the first request go to the map the server actually stored them in.
      const storedAs = new Map(results.filter((r) => r.kind === 'map' && r.storedAs && r.storedAs !== r.id).map((r) => [r.id, r.storedAs as string]));
      for (const p of extraPoints) await post(projectId, newId(), [{ kind: 'points', id: storedAs.get(p.mapId) ?? p.mapId, data: { points: p.points } }]);
      await db.transaction('rw', [db.outbox, db.models, db.sweeps, db.labels, ...rekeyTables(db)], async () => {
        for (const r of results) {
          if (r.revision === undefined) continue;
          if (r.kind === 'model') await db.models.update(r.id, { syncedRev: r.revision });
          else if (r.kind === 'sweep') await db.sweeps.update(r.id, { syncedRev: r.revision });
          else if (r.kind === 'annotation') await db.labels.update(r.id, { syncedRev: r.revision });
        }
        await db.outbox.bulkDelete(batch.map((e) => e.seq as number));
        for (const [from, to] of storedAs) await rekeyMap(db, from, to);
      });
      pushed += batch.length;
    } catch (error) {
      if (!(error instanceof ApiError) || error.kind !== 'http' || error instanceof SignInRequired) throw error;
      if (error.status === 409) {
        const list = ((error.details as { conflicts?: ServerConflict[] } | null)?.conflicts ?? []).filter((c) => LOCAL_OF[c.kind]);
        const now = Date.now();
        await db.transaction('rw', db.conflicts, db.outbox, async () => {
          await db.conflicts.bulkPut(
            list.map((c) => ({ id: `${c.kind}:${c.id}`, projectId, entity: LOCAL_OF[c.kind] as ConflictRecord['entity'], entityId: c.id, yours: c.yours, theirs: c.theirs, createdAt: now })),
          );
          // The rest of the batch goes again (with a new batch id) without the held entities.
          await db.outbox.bulkUpdate(batch.map((e) => ({ key: e.seq as number, changes: { batchId: undefined } })));
        });
        conflictCount += list.length;
        if (list.length === 0) throw new Refused(`the server reported a conflict it did not describe: ${error.serverMessage}`);
        continue;
      }
      if (error.status !== null && error.status >= 400 && error.status < 500 && error.status !== 401 && error.status !== 429) {
        // Refused for a reason a retry will not cure: keep the entries, show why.
        await db.outbox.bulkUpdate(batch.map((e) => ({ key: e.seq as number, changes: { batchId: undefined, error: error.serverMessage } })));
        continue;
      }
      throw error;
    }
  }
  return { pushed, conflicts: conflictCount };
}

// ---------------------------------------------------------------- pull

/** Applies one page of pulled changes (exported for tests). */
export async function applyPulled(projectId: string, changes: PullChange[], cursor: number): Promise<void> {
  await db.transaction('rw', [db.models, db.sweeps, db.maps, db.points, db.labels, db.outbox, db.conflicts, db.syncState], async () => {
    const pending = new Set((await db.outbox.where('projectId').equals(projectId).toArray()).map((e) => e.entityId));
    for (const c of await db.conflicts.where('projectId').equals(projectId).toArray()) pending.add(c.entityId);
    const touchedMaps = new Set<string>();
    for (const ch of changes) {
      const updatedAt = ch.updatedAt ? Date.parse(ch.updatedAt) : Date.now();
      const owner = ch.updatedBy ?? null;
      const d = ch.data;
      if (ch.kind === 'model' || ch.kind === 'sweep' || ch.kind === 'annotation') {
        if (pending.has(ch.id)) continue; // the local edit will be pushed (and may conflict)
      }
      if (ch.kind === 'model') {
        const old = await db.models.get(ch.id);
        await db.models.put({ id: ch.id, projectId, ownerId: old?.ownerId ?? owner, name: String(d.name ?? 'model'), spec: d.spec as ModelSpec, createdAt: old?.createdAt ?? updatedAt, updatedAt, syncedRev: ch.revision });
      } else if (ch.kind === 'sweep') {
        const old = await db.sweeps.get(ch.id);
        const mapId = String(d.mapId ?? '');
        await db.sweeps.put({ id: ch.id, projectId, ownerId: old?.ownerId ?? owner, name: String(d.name ?? 'sweep'), modelId: String(d.modelId ?? ''), mapId, spec: d.spec as SweepSpec, createdAt: old?.createdAt ?? updatedAt, updatedAt, syncedRev: ch.revision });
        if (mapId) await db.maps.update(mapId, { sweepId: ch.id });
      } else if (ch.kind === 'annotation') {
        const old = await db.labels.get(ch.id);
        await db.labels.put({
          id: ch.id,
          mapId: String(d.mapId),
          labelId: String(d.labelId),
          ...(typeof d.name === 'string' ? { name: d.name } : {}),
          ...(typeof d.color === 'string' ? { color: d.color } : {}),
          ...(typeof d.note === 'string' ? { note: d.note } : {}),
          rev: old?.rev ?? 0,
          syncedRev: ch.revision,
          updatedAt,
        });
      } else if (ch.kind === 'map') {
        const old = await db.maps.get(ch.id);
        const sweep = d.sweep as SweepSpec;
        const sweepId = old?.sweepId || (await db.sweeps.where('mapId').equals(ch.id).first())?.id || '';
        const record: MapRecord = {
          id: ch.id,
          projectId,
          ownerId: old?.ownerId ?? owner,
          name: old?.name ?? sweep.name ?? 'map',
          createdAt: old?.createdAt ?? updatedAt,
          updatedAt,
          sweepId,
          identity: String(d.id),
          sweep,
          provenance: d.provenance as MapProvenance,
          method: sweep.method,
          lattice: sweep.model.lattice.kind,
          pointCount: old?.pointCount ?? 0,
        };
        await db.maps.put(record);
        touchedMaps.add(ch.id);
      } else if (ch.kind === 'points') {
        const pts = (d.points ?? {}) as Record<string, MapPoint>;
        await db.points.bulkPut(Object.entries(pts).map(([k, p]) => pointRow(ch.id, k, p)));
        touchedMaps.add(ch.id);
      }
    }
    for (const mapId of touchedMaps) {
      const count = await db.points.where('mapId').equals(mapId).count();
      await db.maps.update(mapId, { pointCount: count });
    }
    const old = await db.syncState.get(projectId);
    await db.syncState.put({ ...(old ?? { failures: 0 }), projectId, cursor, lastPullAt: Date.now() });
  });
}

/** Pulls every change after the project's cursor. */
export async function pullProject(projectId: string): Promise<number> {
  let applied = 0;
  for (;;) {
    const cursor = (await db.syncState.get(projectId))?.cursor ?? 0;
    const res = await apiCall<{ changes: PullChange[]; cursor: number; hasMore: boolean }>(
      `/api/projects/${encodeURIComponent(projectId)}/sync/pull?after=${cursor}&limit=${PULL_PAGE}`,
    );
    await applyPulled(projectId, res.changes, res.cursor);
    applied += res.changes.length;
    if (!res.hasMore) return applied;
  }
}

// ---------------------------------------------------------------- the loop

let current: Promise<void> | null = null;
let timer: ReturnType<typeof setTimeout> | undefined;
let failures = 0;
let started = false;

function schedule(ms: number) {
  if (timer) clearTimeout(timer);
  timer = setTimeout(() => void syncNow(), ms);
}

/** One full round: push then pull every server project of the signed-in account. */
export function syncNow(): Promise<void> {
  current ??= (async () => {
    const session = await currentSession();
    if (!session?.refreshToken) {
      setState({ running: false, needsSignIn: !!session });
      return;
    }
    if (typeof navigator !== 'undefined' && navigator.onLine === false) {
      schedule(IDLE_INTERVAL_MS);
      return;
    }
    setState({ running: true });
    try {
      // The profile (a site role may have changed) and the project list (new memberships) first.
      const me = await apiCall<SessionUser>('/api/users/me');
      const profile = { id: me.id, email: me.email, displayName: me.displayName, siteRole: me.siteRole };
      if (JSON.stringify(profile) !== JSON.stringify(session.user)) await db.session.update('current', { user: profile });
      await fetchAndStoreProjects();
      const projects = await db.projects.where('userId').equals(session.user.id).toArray();
      for (const p of projects) {
        if (p.myRole === 'owner' || p.myRole === 'editor') await pushProject(p.id);
        await pullProject(p.id);
      }
      failures = 0;
      setState({ running: false, lastError: null, lastSyncAt: Date.now(), needsSignIn: false });
      schedule(IDLE_INTERVAL_MS);
    } catch (error) {
      failures++;
      const needsSignIn = error instanceof SignInRequired;
      setState({ running: false, lastError: error instanceof Error ? error.message : String(error), needsSignIn });
      if (!needsSignIn) schedule(Math.min(BACKOFF_MAX_MS, BACKOFF_BASE_MS * 2 ** (failures - 1)));
    }
  })().finally(() => {
    current = null;
  });
  return current;
}

/** Starts the engine once per page: online events, local changes (debounced) and the timer. */
export function startSyncEngine(): void {
  if (started || typeof window === 'undefined') return;
  started = true;
  window.addEventListener('online', () => {
    failures = 0;
    void syncNow();
  });
  let debounce: ReturnType<typeof setTimeout> | undefined;
  liveQuery(() => db.outbox.where('projectId').notEqual(LOCAL_PROJECT_ID).count()).subscribe({
    next: (n) => {
      if (n === 0) return;
      if (debounce) clearTimeout(debounce);
      debounce = setTimeout(() => void syncNow(), CHANGE_DEBOUNCE_MS);
    },
  });
  // Signing in (or in again) starts a round; token rotations and profile updates do not.
  let lastKey = '';
  liveQuery(() => db.session.get('current')).subscribe({
    next: (session) => {
      const key = session ? `${session.user.id}:${session.refreshToken ? 1 : 0}` : '';
      if (key === lastKey) return;
      lastKey = key;
      if (key) void syncNow();
    },
  });
}

// ---------------------------------------------------------------- conflicts and refused entries

/** Keeps my version: the next push carries it with the server's revision as its base. */
export async function resolveKeepMine(conflictId: string, edited?: { name: string }): Promise<void> {
  await db.transaction('rw', [db.conflicts, db.outbox, db.models, db.sweeps, db.labels], async () => {
    const c = await db.conflicts.get(conflictId);
    if (!c) return;
    const rev = c.theirs?.revision ?? 0;
    const patch = { syncedRev: rev, updatedAt: Date.now(), ...(edited ? { name: edited.name } : {}) };
    if (c.entity === 'model') await db.models.update(c.entityId, patch);
    else if (c.entity === 'sweep') await db.sweeps.update(c.entityId, patch);
    else await db.labels.update(c.entityId, patch);
    await db.conflicts.delete(conflictId);
    await db.outbox.where('[entity+entityId]').equals([c.entity, c.entityId]).delete();
    await db.outbox.add({ projectId: c.projectId, entity: c.entity, entityId: c.entityId, op: 'put', createdAt: Date.now() });
  });
}

/** Takes the server's version: it replaces mine on this device; nothing is pushed. */
export async function resolveTakeTheirs(conflictId: string): Promise<void> {
  const c = await db.conflicts.get(conflictId);
  if (!c) return;
  if (!c.theirs) {
    // The server has no such record: taking "theirs" means dropping my change.
    await db.transaction('rw', db.conflicts, db.outbox, async () => {
      await db.conflicts.delete(conflictId);
      await db.outbox.where('[entity+entityId]').equals([c.entity, c.entityId]).delete();
    });
    return;
  }
  const kind = c.entity === 'label' ? 'annotation' : c.entity;
  await db.transaction('rw', [db.conflicts, db.outbox, db.models, db.sweeps, db.maps, db.points, db.labels, db.syncState], async () => {
    await db.conflicts.delete(conflictId);
    await db.outbox.where('[entity+entityId]').equals([c.entity, c.entityId]).delete();
    const theirs = c.theirs as NonNullable<ConflictRecord['theirs']>;
    const cursor = (await db.syncState.get(c.projectId))?.cursor ?? 0;
    await applyPulled(c.projectId, [{ seq: 0, kind, id: c.entityId, revision: theirs.revision, data: theirs.data, updatedBy: theirs.updatedBy, updatedAt: theirs.updatedAt }], cursor);
  });
}

/** Entries the server refused: try them again, or drop them. */
export async function retryRefused(seqs: number[]): Promise<void> {
  await db.outbox.bulkUpdate(seqs.map((seq) => ({ key: seq, changes: { error: undefined, batchId: undefined } })));
}
export async function discardRefused(seqs: number[]): Promise<void> {
  await db.outbox.bulkDelete(seqs);
}
