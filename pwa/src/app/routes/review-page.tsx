import { useEffect, useMemo, useRef, useState } from 'react';
import { Link, useLocation, useParams } from 'react-router-dom';
import { Notice } from '../../components/ui/notice.js';
import { errorText } from '../../lib/api-client.js';
import { useSession } from '../../lib/auth.js';
import { syncNow } from '../../lib/sync-engine.js';
import { useMapPoints, useMapRecord } from '../../features/maps/api/maps.js';
import { useMembers } from '../../features/projects/api/get-members.js';
import { useStoredProject } from '../../features/projects/api/get-projects.js';
import { useReviews } from '../../features/reviews/api/get-reviews.js';
import { ProvenancePanel } from '../../features/reviews/components/provenance-panel.js';
import { RequestReviewForm, ReviewThread } from '../../features/reviews/components/review-thread.js';
import { SpotCheckPanel } from '../../features/reviews/components/spot-check-panel.js';

/**
 * A map that is not on this device yet (e.g. a reviewer opening the link of a review-request
 * e-mail before the project synced): one sync round is started, and the page fills in when the
 * map arrives.
 */
function useFetchMissingMap(missing: boolean, signedIn: boolean): 'idle' | 'syncing' | 'done' {
  const [phase, setPhase] = useState<'idle' | 'syncing' | 'done'>('idle');
  const started = useRef(false);
  useEffect(() => {
    if (!missing || !signedIn || started.current) return;
    started.current = true;
    setPhase('syncing');
    void syncNow().finally(() => setPhase('done'));
  }, [missing, signedIn]);
  return phase;
}

/**
 * /projects/:projectId/maps/:mapId/review — provenance, spot-checks, comments and verdicts of a synced map;
 * /projects/:projectId/maps/:mapId/reviews/:reviewId — the same page from a review-request e-mail, that review first.
 */
export function Component() {
  const { projectId = '', mapId = '', reviewId } = useParams();
  const { pathname } = useLocation();
  const session = useSession();
  const map = useMapRecord(mapId);
  const rows = useMapPoints(mapId);
  const project = useStoredProject(projectId);
  const reviews = useReviews(projectId, mapId, !!session);
  const members = useMembers(projectId, !!session);
  const names = useMemo(() => Object.fromEntries((members.data ?? []).map((m) => [m.userId, m.displayName])), [members.data]);
  const pointKeys = useMemo(() => (rows ?? []).map((r) => r.key).sort(), [rows]);
  const fetching = useFetchMissingMap(map === null, !!session?.refreshToken);
  if (session === null) {
    return (
      <Notice tone="info" title="Sign in to open this review">
        Reviews belong to a shared project.{' '}
        <Link className="font-semibold text-accent-700 underline underline-offset-2" to={`/sign-in?next=${encodeURIComponent(pathname)}`} data-testid="review-sign-in">
          Sign in
        </Link>{' '}
        as a member of the project; this page opens again afterwards.
      </Notice>
    );
  }
  if (map === undefined || rows === undefined || project === undefined || session === undefined) return <p role="status">Loading…</p>;
  if (map === null) {
    return fetching === 'done' ? (
      <Notice tone="warn" title="This map is not on this device">
        The project was synced but has no map with this id for your account: it may have been deleted, or you are not a member of its project.{' '}
        <Link className="font-semibold text-accent-700 underline underline-offset-2" to="/projects">
          Your projects
        </Link>
      </Notice>
    ) : (
      <p role="status" data-testid="review-fetching-map">
        Fetching the map from the project…
      </p>
    );
  }
  const role = project?.myRole;
  const canEdit = role === 'owner' || role === 'editor';
  const canComment = canEdit || role === 'reviewer';
  const list = reviews.data ?? [];
  // The review named in the address (from an e-mail) first, then the open request, then the latest.
  const linked = reviewId ? list.find((r) => r.id === reviewId) : undefined;
  const open = linked ?? list.filter((r) => r.status === 'requested').at(-1) ?? list.at(-1);
  const ordered = linked ? [linked, ...list.filter((r) => r !== linked)] : list;
  const outdated = list.filter((r) => r.outdated);
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
      {reviewId && reviews.isSuccess && !linked ? (
        <Notice tone="warn" title="The review in this link was not found">
          It may belong to another map; the reviews of this map are below.
        </Notice>
      ) : null}
      {outdated.length > 0 ? (
        <Notice tone="warn" title={outdated.length === 1 ? 'A verdict is outdated' : `${outdated.length} verdicts are outdated`}>
          <span data-testid="review-outdated-summary">
            The map on the server gained or changed points after the verdict was given: the verdict covers only the {outdated[0].pointCount ?? ''} points it
            was given on. Ask for a new review (or a new verdict) to cover the rest.
          </span>
        </Notice>
      ) : null}
      {list.length === 0 && reviews.isSuccess ? <p className="text-sm text-ink-700" data-testid="no-reviews">No review of this map has been requested yet.</p> : null}
      {ordered.map((r) => (
        <ReviewThread key={r.id} projectId={projectId} review={r} myUserId={session?.user.id} canComment={canComment} pointKeys={pointKeys} names={names} />
      ))}
      {canEdit ? <RequestReviewForm projectId={projectId} mapId={map.id} /> : null}
      <SpotCheckPanel map={map} rows={rows} projectId={projectId} reviewId={open?.id} canAskServer={canComment} serverReports={open?.spotChecks ?? []} />
      <ProvenancePanel map={map} points={rows.map((r) => r.point)} />
    </div>
  );
}
