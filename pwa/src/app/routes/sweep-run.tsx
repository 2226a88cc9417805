import { Link, useParams } from 'react-router-dom';
import { MapView } from '../../features/maps/components/map-view.js';
import { useSweep } from '../../features/sweeps/api/sweeps.js';
import { SweepControls } from '../../features/sweeps/components/sweep-controls.js';
import { sharedPool } from '../../features/sweeps/lib/run-manager.js';
import type { PointRequest } from '@phasewright/physics-core';

export const solveDetail = (request: PointRequest) => sharedPool().solveDetail(request);

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
      <MapView mapId={sweep.mapId} solveDetail={solveDetail} />
    </div>
  );
}
