import type { MapPoint } from '@phasewright/physics-core';
import { useMemo, useState } from 'react';
import { useLiveQuery } from 'dexie-react-hooks';
import { Link, Navigate, useParams } from 'react-router-dom';
import { useMapPoints, useMapRecord } from '../../features/maps/api/maps.js';
import { useStoredProject } from '../../features/projects/api/get-projects.js';
import { useReviews } from '../../features/reviews/api/get-reviews.js';
import { REVIEW_STATE_TEXT, mapReviewState } from '../../features/reviews/lib/review-state.js';
import { useSession } from '../../lib/auth.js';
import { db, LOCAL_PROJECT_ID, LOCAL_PROJECT_NAME } from '../../lib/db.js';
import { pointsDigest } from '../../lib/sync-engine.js';
import { MapView } from '../../features/maps/components/map-view.js';
import { ExportPanel } from '../../features/maps/components/export-panel.js';
import type { MeasurementRow } from '../../features/maps/lib/measurements.js';
import { MeasurementsPanel } from '../../features/uploads/components/measurements-panel.js';
import { solveDetail } from './sweep-run.js';

/** /maps/:id */
export function Component() {
  const { id } = useParams();
  const map = useMapRecord(id);
  const rows = useMapPoints(id);
  const project = useStoredProject(map && map.projectId !== LOCAL_PROJECT_ID ? map.projectId : undefined);
  const session = useSession();
  const reviews = useReviews(project?.id ?? '', id ?? '', !!project && !!session?.refreshToken);
  const reviewState = reviews.data ? mapReviewState(reviews.data) : undefined;
  const [measured, setMeasured] = useState<MeasurementRow[]>();
  // A map re-keyed to the server's id after a push (lib/rekey-map.ts): its old address still leads to it.
  const movedTo = useLiveQuery(async () => (map === null && id ? ((await db.mapAliases.get(id))?.mapId ?? null) : null), [map, id]);
  // The digest the server keeps for a map's point set; equal digests on two devices mean equal points.
  const digest = useMemo(() => {
    if (!rows) return undefined;
    const points: Record<string, MapPoint> = {};
    for (const r of rows) points[r.key] = r.point;
    return pointsDigest(points);
  }, [rows]);
  if (map === undefined) return <p role="status">Loading…</p>;
  if (map === null && movedTo) return <Navigate replace to={`/maps/${encodeURIComponent(movedTo)}`} />;
  if (map === null || !id) return <p>No map with this id on this device.</p>;
  return (
    <div className="space-y-5">
      <title>{`${map.name} · Phasewright`}</title>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm font-semibold text-ink-600">Map · {map.pointCount} points · core {map.provenance.coreVersion}</p>
          <h1 className="text-2xl font-bold tracking-tight text-ink-900">{map.name}</h1>
          <p className="mt-1 font-mono text-xs text-ink-600">
            {project ? project.name : LOCAL_PROJECT_NAME} · identity <span data-testid="map-identity" title={map.identity}>{map.identity.slice(0, 16)}</span> · points digest{' '}
            <span data-testid="map-digest" data-points={rows?.length ?? 0} title={digest}>
              {digest?.slice(0, 16) ?? '…'}
            </span>
          </p>
        </div>
        <div className="flex gap-4 text-sm font-semibold">
          <Link className="text-accent-700 underline underline-offset-2" to={`/compare?a=${id}`}>
            Compare with…
          </Link>
          {project ? (
            <Link className="text-accent-700 underline underline-offset-2" to={`/projects/${project.id}/maps/${id}/review`} data-testid="map-review-link">
              Review
            </Link>
          ) : null}
          {reviewState && reviewState !== 'none' ? (
            <span className={reviewState === 'approved' ? 'text-good-700' : reviewState === 'requested' ? 'text-ink-700' : 'text-amber-900'} data-testid="map-review-state" data-state={reviewState}>
              {REVIEW_STATE_TEXT[reviewState]}
            </span>
          ) : null}
          {map.sweepId ? (
            <Link className="text-accent-700 underline underline-offset-2" to={`/sweeps/${map.sweepId}`}>
              The sweep and its run
            </Link>
          ) : null}
        </div>
      </div>
      {rows ? <ExportPanel map={map} rows={rows} projectId={project ? project.id : undefined} /> : null}
      {project ? <MeasurementsPanel projectId={project.id} mapId={id} canUpload={project.myRole === 'owner' || project.myRole === 'editor'} onRows={setMeasured} /> : null}
      <MapView measured={measured} mapId={id} solveDetail={solveDetail} canAnnotate={!project || project.myRole === 'owner' || project.myRole === 'editor'} />
    </div>
  );
}
