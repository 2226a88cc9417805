import { useMemo } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Notice } from '../../components/ui/notice.js';
import { errorText } from '../../lib/api-client.js';
import { useSession } from '../../lib/auth.js';
import { useMapPoints, useMapRecord } from '../../features/maps/api/maps.js';
import { useMembers } from '../../features/projects/api/get-members.js';
import { useStoredProject } from '../../features/projects/api/get-projects.js';
import { useReviews } from '../../features/reviews/api/get-reviews.js';
import { ProvenancePanel } from '../../features/reviews/components/provenance-panel.js';
import { RequestReviewForm, ReviewThread } from '../../features/reviews/components/review-thread.js';
import { SpotCheckPanel } from '../../features/reviews/components/spot-check-panel.js';

/** /projects/:projectId/maps/:mapId/review — provenance, spot-checks, comments and verdicts of a synced map. */
export function Component() {
  const { projectId = '', mapId = '' } = useParams();
  const map = useMapRecord(mapId);
  const rows = useMapPoints(mapId);
  const project = useStoredProject(projectId);
  const session = useSession();
  const reviews = useReviews(projectId, mapId);
  const members = useMembers(projectId);
  const names = useMemo(() => Object.fromEntries((members.data ?? []).map((m) => [m.userId, m.displayName])), [members.data]);
  const pointKeys = useMemo(() => (rows ?? []).map((r) => r.key).sort(), [rows]);
  if (map === undefined || rows === undefined || project === undefined) return <p role="status">Loading…</p>;
  if (map === null) return <p>No map with this id on this device; open the project and let it sync first.</p>;
  const role = project?.myRole;
  const canEdit = role === 'owner' || role === 'editor';
  const canComment = canEdit || role === 'reviewer';
  const list = reviews.data ?? [];
  const open = list.filter((r) => r.status === 'requested').at(-1) ?? list.at(-1);
  return (
    <div className="space-y-5">
      <title>{`Review · ${map.name} · Phasewright`}</title>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm font-semibold text-ink-600">Review · {project?.name ?? projectId} · {rows.length} points</p>
          <h1 className="text-2xl font-bold tracking-tight text-ink-900">{map.name}</h1>
        </div>
        <Link className="text-sm font-semibold text-accent-700 underline underline-offset-2" to={`/maps/${map.id}`}>
          Back to the map
        </Link>
      </div>
      {reviews.error ? (
        <Notice tone="error" title="Reviews could not be loaded">
          {errorText(reviews.error)}
        </Notice>
      ) : null}
      {list.length === 0 && reviews.isSuccess ? <p className="text-sm text-ink-700" data-testid="no-reviews">No review of this map has been requested yet.</p> : null}
      {list.map((r) => (
        <ReviewThread key={r.id} projectId={projectId} review={r} myUserId={session?.user.id} canComment={canComment} pointKeys={pointKeys} names={names} />
      ))}
      {canEdit ? <RequestReviewForm projectId={projectId} mapId={map.id} /> : null}
      <SpotCheckPanel map={map} rows={rows} projectId={projectId} reviewId={open?.id} canAskServer={canComment} serverReports={open?.spotChecks ?? []} />
      <ProvenancePanel map={map} points={rows.map((r) => r.point)} />
    </div>
  );
}
