import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';
import { useRefetchAfterSync } from '../../sync/hooks/use-refetch-after-sync.js';
import type { MapReviewState } from '../lib/review-state.js';
import { reviewKeys } from './get-reviews.js';

/** One map of a project and the state of its latest review, as the server reports it. */
export interface MapReviewStateDto {
  mapId: string;
  state: MapReviewState;
  /** The latest review; null when the map has none. */
  reviewId: string | null;
  reviewerId: string | null;
  reviewerName: string | null;
  /** When the latest review last changed (ISO time); null when none. */
  updatedAt: string | null;
  /** The map's current number of points on the server. */
  pointCount: number;
}

/** GET /api/projects/:projectId/reviews (any member): every map of the project with its latest review state. */
export function getReviewStates(projectId: string, { signal }: { signal?: AbortSignal } = {}): Promise<MapReviewStateDto[]> {
  return apiCall<MapReviewStateDto[]>(`/api/projects/${encodeURIComponent(projectId)}/reviews`, { signal });
}

export const reviewStatesQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: reviewKeys.project(projectId), queryFn: ({ signal }) => getReviewStates(projectId, { signal }), retry: false });

/**
 * The review states of a project's maps in one request. `enabled` false while offline or signed
 * out. Read again after every finished sync round (a push of new points may make a verdict outdated).
 */
export function useReviewStates(projectId: string, enabled = true) {
  const query = useQuery({ ...reviewStatesQueryOptions(projectId), enabled });
  useRefetchAfterSync(query, enabled);
  return query;
}
