import { Link, useParams } from 'react-router-dom';
import { useMapRecord } from '../../features/maps/api/maps.js';
import { MapView } from '../../features/maps/components/map-view.js';
import { solveDetail } from './sweep-run.js';

/** /maps/:id */
export function Component() {
  const { id } = useParams();
  const map = useMapRecord(id);
  if (map === undefined) return <p role="status">Loading…</p>;
  if (map === null || !id) return <p>No map with this id on this device.</p>;
  return (
    <div className="space-y-5">
      <title>{`${map.name} · Phasewright`}</title>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm font-semibold text-ink-600">Map · {map.pointCount} points · core {map.provenance.coreVersion}</p>
          <h1 className="text-2xl font-bold tracking-tight text-ink-900">{map.name}</h1>
        </div>
        <Link className="text-sm font-semibold text-accent-700 underline underline-offset-2" to={`/sweeps/${map.sweepId}`}>
          The sweep and its run
        </Link>
      </div>
      <MapView mapId={id} solveDetail={solveDetail} />
    </div>
  );
}
