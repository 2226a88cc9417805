/**
 * The local source of truth: one typed Dexie database. Every released schema version stays
 * declared here with its upgrade, so a browser that last ran any older build opens cleanly.
 *
 * Ownership: every record carries `projectId` (and `ownerId`). The device's local space is
 * `LOCAL_PROJECT_ID` (owner `null`, never synced); server projects have the server's ids, and the
 * outbox queues their changes for the sync engine (lib/sync-engine.ts).
 *
 * Schema v3 adds the signed-in session (user profile and refresh token; the access token stays in
 * memory), a copy of the server projects for offline use, per-project sync state (the pull cursor)
 * and the conflicts a push returned. Schema v4 adds map aliases: a map the server stored under
 * another id (same identity, `storedAs` in the push answer) is re-keyed to the server's id, and the
 * old id stays findable (lib/rekey-map.ts).
 */
import { Dexie, type EntityTable, type Table } from 'dexie';
import type { MapPoint, MapProvenance, ModelSpec, SweepSpec } from '@phasewright/physics-core';

export const DB_NAME = 'phasewright';
export const LOCAL_PROJECT_ID = 'device';
export const LOCAL_PROJECT_NAME = 'This device';

interface Owned {
  id: string;
  /** Project the record belongs to (`LOCAL_PROJECT_ID` for the local-only space). */
  projectId: string;
  /** Account that created it; null in the local-only space. */
  ownerId: string | null;
  name: string;
  /** Milliseconds since the epoch. */
  createdAt: number;
  updatedAt: number;
  /** Server projects: the server revision this local copy started from (absent: never synced). */
  syncedRev?: number;
}

/** A model as last saved from the editor; `spec` passed `parseModelSpec` when saved. */
export interface ModelRecord extends Owned {
  spec: ModelSpec;
}

/** A sweep: its spec (with the model embedded, as the engine needs it) and the model it came from. */
export interface SweepRecord extends Owned {
  modelId: string;
  spec: SweepSpec;
  /** The map this sweep writes into (created with the sweep). */
  mapId: string;
}

/** A map's header; its points live in `points` (one row per point, written as they arrive). */
export interface MapRecord extends Owned {
  sweepId: string;
  /** physics-core's map identity (`mapIdentity(sweep, coreVersion)`), used by resume and merge. */
  identity: string;
  sweep: SweepSpec;
  provenance: MapProvenance;
  method: SweepSpec['method'];
  lattice: ModelSpec['lattice']['kind'];
  pointCount: number;
}

export interface PointRow {
  mapId: string;
  /** The canonical parameter key (`J=1,V=0.5`). */
  key: string;
  point: MapPoint;
  /** Denormalised for filtering (schema v2): the point's phase label id, '' when none. */
  labelId: string;
  /** Denormalised (schema v2): 1 when converged, 0 when not. */
  converged: 0 | 1;
}

/** A person's annotation of one phase label on one map: a display name, a colour, a note. */
export interface LabelAnnotation {
  id: string;
  mapId: string;
  labelId: string;
  name?: string;
  color?: string;
  note?: string;
  /** Local edit counter. */
  rev: number;
  updatedAt: number;
  /** Server projects: the server revision this local copy started from (absent: never synced). */
  syncedRev?: number;
}

export type RunState = 'running' | 'paused' | 'cancelled' | 'done' | 'failed';

/** The state of a sweep's run, so that a closed tab can resume it from the points stored. */
export interface RunRecord {
  /** The sweep id (one run record per sweep). */
  id: string;
  mapId: string;
  state: RunState;
  done: number;
  total: number;
  failed: number;
  startedAt: number;
  updatedAt: number;
  error?: string;
}

/** A local change waiting for the sync engine. */
export interface OutboxEntry {
  seq?: number;
  projectId: string;
  /** `map` stands for the map's header and all its points (the server merges point by point). */
  entity: 'model' | 'sweep' | 'map' | 'point' | 'label';
  entityId: string;
  op: 'put' | 'delete';
  createdAt: number;
  /** Set when a push of this entry started; every retry sends the same batch id (idempotent). */
  batchId?: string;
  /** Set when the server refused the batch for a reason a retry will not cure (shown on the sync page). */
  error?: string;
}

/** The signed-in account on this device (one row, id `current`). */
export interface SessionRecord {
  id: 'current';
  user: { id: string; email: string; displayName: string; siteRole: 'admin' | 'member' };
  /** Single-use; rotated by every refresh. Null after the server refused it (sign in again). */
  refreshToken: string | null;
  refreshExpiresAt: string | null;
  signedInAt: number;
}

export type ProjectRole = 'owner' | 'editor' | 'reviewer' | 'viewer';

/** A server project as last seen (so that its home opens offline). */
export interface ProjectRecord {
  id: string;
  name: string;
  description: string;
  myRole: ProjectRole;
  archived: boolean;
  updatedAt: number;
  /** The account this copy belongs to (another account signing in on this device sees its own). */
  userId: string;
}

/** Sync bookkeeping of one server project. */
export interface SyncStateRecord {
  projectId: string;
  /** The pull cursor (the project's change number last applied). */
  cursor: number;
  lastPullAt?: number;
  lastPushAt?: number;
  /** Failed attempts in a row (for the back-off); 0 after a success. */
  failures: number;
  lastError?: string;
}

/** A stale edit the server refused; the user picks mine, theirs, or an edited version. */
export interface ConflictRecord {
  id: string;
  projectId: string;
  entity: 'model' | 'sweep' | 'label';
  entityId: string;
  /** What this device pushed (the server's shape of the record). */
  yours: Record<string, unknown>;
  theirs: { revision: number; data: Record<string, unknown>; updatedBy: string | null; updatedAt: string } | null;
  createdAt: number;
}

/** The local id a map had before it was re-keyed to the server's id (links keep working). */
export interface MapAlias {
  /** The old (local) map id. */
  id: string;
  /** The id the map has now (the server's). */
  mapId: string;
  projectId: string;
  createdAt: number;
}

/** Version 1 stores (released first). */
export const SCHEMA_V1 = {
  models: 'id, projectId, updatedAt, name',
  sweeps: 'id, projectId, modelId, mapId, updatedAt',
  maps: 'id, projectId, sweepId, identity, updatedAt',
  points: '[mapId+key], mapId',
  labels: 'id, mapId, [mapId+labelId]',
  runs: 'id, mapId, state, updatedAt',
  outbox: '++seq, projectId, createdAt',
} as const;

/** Version 2: points indexed by label and convergence for filtered tables. */
export const SCHEMA_V2 = {
  ...SCHEMA_V1,
  points: '[mapId+key], mapId, [mapId+labelId], [mapId+converged]',
} as const;

/** Version 3: session, server projects, sync state, conflicts; the outbox by entity. */
export const SCHEMA_V3 = {
  ...SCHEMA_V2,
  outbox: '++seq, projectId, createdAt, [entity+entityId], batchId',
  session: 'id',
  projects: 'id, userId, updatedAt',
  syncState: 'projectId',
  conflicts: 'id, projectId, entityId',
} as const;

/** Version 4: aliases of re-keyed maps. */
export const SCHEMA_V4 = {
  ...SCHEMA_V3,
  mapAliases: 'id, mapId',
} as const;

export class PhasewrightDb extends Dexie {
  models!: EntityTable<ModelRecord, 'id'>;
  sweeps!: EntityTable<SweepRecord, 'id'>;
  maps!: EntityTable<MapRecord, 'id'>;
  points!: Table<PointRow, [string, string]>;
  labels!: EntityTable<LabelAnnotation, 'id'>;
  runs!: EntityTable<RunRecord, 'id'>;
  outbox!: EntityTable<OutboxEntry, 'seq'>;
  session!: EntityTable<SessionRecord, 'id'>;
  projects!: EntityTable<ProjectRecord, 'id'>;
  syncState!: EntityTable<SyncStateRecord, 'projectId'>;
  conflicts!: EntityTable<ConflictRecord, 'id'>;
  mapAliases!: EntityTable<MapAlias, 'id'>;

  constructor(name: string = DB_NAME, options?: ConstructorParameters<typeof Dexie>[1]) {
    super(name, options);
    this.version(1).stores(SCHEMA_V1);
    this.version(2)
      .stores(SCHEMA_V2)
      .upgrade(async (tx) => {
        await tx
          .table('points')
          .toCollection()
          .modify((row: Partial<PointRow> & { point: MapPoint }) => {
            row.labelId = row.point.label?.id ?? '';
            row.converged = row.point.convergence.converged ? 1 : 0;
          });
      });
    this.version(3).stores(SCHEMA_V3);
    this.version(4).stores(SCHEMA_V4);
  }
}

/** The row stored for a point (the denormalised fields follow the point). */
export function pointRow(mapId: string, key: string, point: MapPoint): PointRow {
  return { mapId, key, point, labelId: point.label?.id ?? '', converged: point.convergence.converged ? 1 : 0 };
}

/** A random id (client-generated, so that sync stays idempotent). */
export function newId(): string {
  return crypto.randomUUID();
}

/** The app's database (one per page; tests make their own with another name). */
export const db = new PhasewrightDb();

/**
 * Queues a change for the sync engine, once: an entry for the same entity that has not started
 * pushing yet already covers it (the push reads the record as it is then). Call inside a
 * transaction that includes `db.outbox`.
 */
export async function queueChange(database: PhasewrightDb, projectId: string, entity: OutboxEntry['entity'], entityId: string): Promise<void> {
  const waiting = await database.outbox
    .where('[entity+entityId]')
    .equals([entity, entityId])
    .filter((e) => !e.batchId && !e.error)
    .count();
  if (waiting === 0) await database.outbox.add({ projectId, entity, entityId, op: 'put', createdAt: Date.now() });
}
