import { MAX_REFINE_DEPTH, parseSweepSpec, type PointRequest, type SweepSpec } from '@phasewright/physics-core';
import { useState, useSyncExternalStore } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Button } from '../../components/ui/button.js';
import { MapView } from '../../features/maps/components/map-view.js';
import { useStoredProject } from '../../features/projects/api/get-projects.js';
import { useRun, useSweep } from '../../features/sweeps/api/sweeps.js';
import { SweepControls } from '../../features/sweeps/components/sweep-controls.js';
import { getLiveRun, isActive, sharedPool, startRun, subscribe } from '../../features/sweeps/lib/run-manager.js';
import { LOCAL_PROJECT_ID, db, queueChange, type SweepRecord } from '../../lib/db.js';

export const solveDetail = (request: PointRequest) => sharedPool().solveDetail(request);

/**
 * Refines a finished sweep in place: a deeper `refine.maxDepth` keeps the map's identity (refinement
 * is left out of it), so the new points land in the same map, are pushed to its project and make
 * any earlier review verdict on the map outdated.
 */
export async function refineSweep(sweepId: string, maxDepth: number): Promise<void> {
  await db.transaction('rw', [db.sweeps, db.maps, db.outbox], async () => {
    const sweep = await db.sweeps.get(sweepId);
    if (!sweep) throw new Error(`no sweep ${sweepId} on this device`);
    const spec: SweepSpec = parseSweepSpec({ ...sweep.spec, refine: { maxDepth, on: sweep.spec.refine?.on ?? ['label'] } });
    const now = Date.now();
    await db.sweeps.update(sweepId, { spec, updatedAt: now });
    await db.maps.update(sweep.mapId, { sweep: spec, updatedAt: now });
    if (sweep.projectId !== LOCAL_PROJECT_ID) {
      await queueChange(db, sweep.projectId, 'sweep', sweepId);
      await queueChange(db, sweep.projectId, 'map', sweep.mapId);
    }
  });
  await startRun(sweepId);
}

/** Deeper refinement near phase boundaries for a finished run (1D bisection, 2D quadtree). */
function RefinePanel({ sweep }: { sweep: SweepRecord }) {
  const live = useSyncExternalStore(subscribe, () => getLiveRun(sweep.id));
  const stored = useRun(sweep.id);
  const project = useStoredProject(sweep.projectId === LOCAL_PROJECT_ID ? undefined : sweep.projectId);
  const current = sweep.spec.refine?.maxDepth ?? 0;
  const [depth, setDepth] = useState(String(Math.min(MAX_REFINE_DEPTH, current + 1)));
  const [error, setError] = useState<string | null>(null);
  const state = live?.state ?? stored?.state;
  const canEdit = sweep.projectId === LOCAL_PROJECT_ID || project?.myRole === 'owner' || project?.myRole === 'editor';
  if (!canEdit || isActive(sweep.id) || (state !== 'done' && state !== 'cancelled')) return null;
  const n = Number(depth);
  const valid = Number.isInteger(n) && n > current && n <= MAX_REFINE_DEPTH;
  const criteria = (sweep.spec.refine?.on ?? ['label']).map((c) => (c === 'label' ? 'neighbouring labels differ' : 'the fidelity susceptibility peaks')).join(' or ');
  return (
    <form
      aria-label="Refine"
      className="flex flex-wrap items-end gap-3 rounded-xl border border-line bg-surface p-4 text-sm"
      onSubmit={(e) => {
        e.preventDefault();
        if (!valid) return;
        setError(null);
        refineSweep(sweep.id, n).catch((err: unknown) => setError(err instanceof Error ? err.message : String(err)));
      }}
    >
      <div className="max-w-xl flex-1">
        <p className="font-semibold text-ink-900">Refine near boundaries</p>
        <p className="text-ink-700">
          Adds points inside cells where {criteria}, into this same map (now depth {current}). Stored points are kept; new points are synced
          to the project, and a review verdict given before then is marked outdated. A change of label or a fidelity peak on a finite cluster
          indicates a transition; it does not prove one.
        </p>
      </div>
      <label className="text-xs font-semibold text-ink-700">
        Depth
        <input
          className="mt-1 block w-20 rounded-md border border-line bg-surface px-2 py-1.5 text-sm"
          inputMode="numeric"
          value={depth}
          onChange={(e) => setDepth(e.target.value)}
          data-path="$.refine.maxDepth"
          aria-invalid={!valid}
        />
      </label>
      <Button type="submit" disabled={!valid} data-testid="refine-run">
        Refine
      </Button>
      {!valid ? <p className="w-full text-xs font-medium text-red-800">The depth must be a whole number from {current + 1} to {MAX_REFINE_DEPTH}.</p> : null}
      {error ? <p className="w-full text-red-800" role="alert">{error}</p> : null}
    </form>
  );
}

/** /sweeps/:id — the run's controls and its map filling in. */
export function Component() {
  const { id } = useParams();
  const sweep = useSweep(id);
  if (sweep === undefined) return <p role="status">Loading…</p>;
  if (sweep === null || !id) return <p>No sweep with this id on this device.</p>;
  return (
    <div className="space-y-5">
      <title>{`${sweep.name} · Phasewright`}</title>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm font-semibold text-ink-600">Sweep · {sweep.spec.method === 'ed' ? 'exact diagonalization' : 'mean-field'}</p>
          <h1 className="text-2xl font-bold tracking-tight text-ink-900">{sweep.name}</h1>
        </div>
        <div className="flex gap-4 text-sm font-semibold">
          <Link className="text-accent-700 underline underline-offset-2" to={`/models/${sweep.modelId}`}>
            Model
          </Link>
          <Link className="text-accent-700 underline underline-offset-2" to={`/maps/${sweep.mapId}`}>
            Open the map
          </Link>
        </div>
      </div>
      <SweepControls sweepId={id} />
      <RefinePanel key={sweep.spec.refine?.maxDepth ?? 0} sweep={sweep} />
      <MapView mapId={sweep.mapId} solveDetail={solveDetail} />
    </div>
  );
}
