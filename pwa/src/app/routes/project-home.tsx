import { useLiveQuery } from 'dexie-react-hooks';
import { useMemo } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useMembers } from '../../features/projects/api/get-members.js';
import { useStoredProject } from '../../features/projects/api/get-projects.js';
import { ProjectItems, type ReviewStateInfo } from '../../features/projects/components/project-items.js';
import { useReviewStates } from '../../features/reviews/api/get-review-states.js';
import { REVIEW_STATE_TEXT, reviewStatesByMap, type MapReviewState } from '../../features/reviews/lib/review-state.js';
import { useSession } from '../../lib/auth.js';
import { db } from '../../lib/db.js';
import { useOnlineStatus } from '../../lib/use-online-status.js';

const REVIEW_OPTIONS = (Object.keys(REVIEW_STATE_TEXT) as MapReviewState[]).map((value) => ({ value, label: REVIEW_STATE_TEXT[value] }));

/**
 * Review states of the project's maps stored on this device, from one request for the whole
 * project; undefined while loading, or when offline / signed out.
 */
function useProjectReviewStates(projectId: string, enabled: boolean): Record<string, ReviewStateInfo> | undefined {
  const mapIds = useLiveQuery(async () => (await db.maps.where('projectId').equals(projectId).primaryKeys()).sort(), [projectId]);
  const states = useReviewStates(projectId, enabled);
  return useMemo(() => (enabled && mapIds !== undefined && states.data ? reviewStatesByMap(mapIds, states.data) : undefined), [enabled, mapIds, states.data]);
}

/** /projects/:id — a server project as stored on this device (opens offline). */
export function Component() {
  const { id = '' } = useParams();
  const project = useStoredProject(id);
  const session = useSession();
  const online = useOnlineStatus();
  const signedIn = !!session?.refreshToken;
  const members = useMembers(id, signedIn && online);
  const authors = useMemo(() => Object.fromEntries((members.data ?? []).map((m) => [m.userId, m.displayName])), [members.data]);
  const reviewStates = useProjectReviewStates(id, signedIn && online && !!project);
  if (project === undefined) return <p role="status">Loading…</p>;
  if (project === null || !id) {
    return (
      <p>
        This project is not on this device. <Link className="font-semibold text-accent-700 underline" to="/projects">See your projects</Link>.
      </p>
    );
  }
  const canEdit = project.myRole === 'owner' || project.myRole === 'editor';
  return (
    <div className="space-y-5">
      <title>{`${project.name} · Phasewright`}</title>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm font-semibold text-ink-600">Shared project · you are {project.myRole}</p>
          <h1 className="text-2xl font-bold tracking-tight text-ink-900">{project.name}</h1>
          {project.description ? <p className="mt-1 text-sm text-ink-700">{project.description}</p> : null}
        </div>
        <div className="flex items-center gap-3 text-sm font-semibold">
          <Link to={`/projects/${id}/members`} className="text-accent-700 underline underline-offset-2">
            Members
          </Link>
          {canEdit ? (
            <Link to={`/models/new?project=${id}`} className="rounded-md bg-accent-600 px-3.5 py-2 text-white hover:bg-accent-700 dark:hover:bg-accent-300">
              New model
            </Link>
          ) : null}
        </div>
      </div>
      <ProjectItems
        projectId={id}
        authors={authors}
        myUserId={session?.user.id}
        reviewStates={reviewStates}
        reviewStateOptions={REVIEW_OPTIONS}
        reviewStatesNote={!online ? 'Review states need the server (offline).' : !signedIn ? 'Sign in to see review states.' : 'Reading review states…'}
      />
    </div>
  );
}
