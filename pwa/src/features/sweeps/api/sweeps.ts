/** Sweeps and their maps in the local database. */
import { CORE_VERSION, mapIdentity, type PhaseMap, type SweepSpec } from '@phasewright/physics-core';
import { useLiveQuery } from 'dexie-react-hooks';
import { currentSession } from '../../../lib/auth.js';
import { LOCAL_PROJECT_ID, db, newId, queueChange, type MapRecord, type RunRecord, type SweepRecord } from '../../../lib/db.js';

export function runtimeInfo(): PhaseMap['provenance']['runtime'] {
  return { kind: 'browser', version: navigator.userAgent, cores: navigator.hardwareConcurrency || 1 };
}

/**
 * Who is computing, as the map's provenance records it: the signed-in user's display name (not the
 * e-mail address: maps leave the group in exports and methods summaries), or nothing when signed
 * out (local-only work).
 */
export async function provenanceAuthor(): Promise<string | undefined> {
  const session = await currentSession();
  return session?.user.displayName;
}

/** Creates a sweep and its (empty) map in the model's project; returns the sweep id. */
export async function createSweep(spec: SweepSpec, modelId: string): Promise<string> {
  const model = await db.models.get(modelId);
  const projectId = model?.projectId ?? LOCAL_PROJECT_ID;
  const ownerId = model?.ownerId ?? null;
  const now = Date.now();
  const sweepId = newId();
  const mapId = newId();
  const name = spec.name ?? `${spec.model.name ?? 'model'} · ${spec.axes.map((a) => a.parameter).join(' × ')}`;
  const createdAt = new Date(now).toISOString();
  const author = await provenanceAuthor();
  const by = author !== undefined ? { author } : {};
  const sweep: SweepRecord = { id: sweepId, projectId, ownerId, name, createdAt: now, updatedAt: now, modelId, spec, mapId };
  const map: MapRecord = {
    id: mapId,
    projectId,
    ownerId,
    name,
    createdAt: now,
    updatedAt: now,
    sweepId,
    identity: mapIdentity(spec, CORE_VERSION),
    sweep: spec,
    provenance: { ...by, createdAt, runtime: runtimeInfo(), seeds: [spec.seed ?? 0], coreVersion: CORE_VERSION, warnings: [], sources: [{ ...by, createdAt, runtime: runtimeInfo() }] },
    method: spec.method,
    lattice: spec.model.lattice.kind,
    pointCount: 0,
  };
  await db.transaction('rw', db.sweeps, db.maps, db.outbox, async () => {
    await db.sweeps.add(sweep);
    await db.maps.add(map);
    await queueChange(db, projectId, 'sweep', sweepId);
    await queueChange(db, projectId, 'map', mapId);
  });
  return sweepId;
}

/** The map as physics-core's PhaseMap (header from `maps`, points from `points`), e.g. to resume. */
export async function loadPhaseMap(mapId: string): Promise<PhaseMap | undefined> {
  const header = await db.maps.get(mapId);
  if (!header) return undefined;
  const rows = await db.points.where('mapId').equals(mapId).toArray();
  const points: PhaseMap['points'] = {};
  for (const r of rows) points[r.key] = r.point;
  return { spec: 'phasewright.map/1', id: header.identity, sweep: header.sweep, points, provenance: header.provenance };
}

export function useSweep(id: string | undefined): SweepRecord | null | undefined {
  return useLiveQuery(async () => (id ? ((await db.sweeps.get(id)) ?? null) : null), [id]);
}

export function useRun(sweepId: string | undefined): RunRecord | null | undefined {
  return useLiveQuery(async () => (sweepId ? ((await db.runs.get(sweepId)) ?? null) : null), [sweepId]);
}
