/**
 * The local source of truth: one typed Dexie database. Every released schema version stays
 * declared here with its upgrade, so a browser that last ran any older build opens cleanly.
 *
 * Ownership: every record carries `projectId` (and `ownerId`). Until the accounts API exists the
 * only project is this device's local space (`LOCAL_PROJECT_ID`, owner `null`); server projects
 * will slot in with their own ids, and the outbox queues changes for the sync engine.
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
  /** Edit revision (the sync server refuses stale edits by it). */
  rev: number;
  updatedAt: number;
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
  entity: 'model' | 'sweep' | 'map' | 'point' | 'label';
  entityId: string;
  op: 'put' | 'delete';
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

export class PhasewrightDb extends Dexie {
  models!: EntityTable<ModelRecord, 'id'>;
  sweeps!: EntityTable<SweepRecord, 'id'>;
  maps!: EntityTable<MapRecord, 'id'>;
  points!: Table<PointRow, [string, string]>;
  labels!: EntityTable<LabelAnnotation, 'id'>;
  runs!: EntityTable<RunRecord, 'id'>;
  outbox!: EntityTable<OutboxEntry, 'seq'>;

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
