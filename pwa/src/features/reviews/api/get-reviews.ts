import type { SpotCheckComparison, SpotCheckPointResult } from '@phasewright/physics-core';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';
import { useRefetchAfterSync } from '../../sync/hooks/use-refetch-after-sync.js';

/**
 * A stored server spot-check (physics-core's comparison plus where and when). Reports stored before
 * the shared rule may lack `outcome`, `note`, the counts and `method`, and carry a point's reason as
 * `failed`.
 */
export interface ServerSpotCheckReport extends Omit<SpotCheckComparison, 'points'> {
  id: string;
  mapId: string;
  reviewId: string | null;
  seed: number;
  points: (SpotCheckPointResult & { failed?: string })[];
  timing: { totalMs: number; pointsMs: number; workers: number };
  runtime: Record<string, unknown>;
  requestedBy: string | null;
  createdAt: string;
}

export interface ReviewCommentDto {
  id: string;
  authorId: string | null;
  authorName: string | null;
  pointKey: string | null;
  body: string;
  createdAt: string;
}

export type ReviewStatus = 'requested' | 'approved' | 'changes-requested';

export interface ReviewDto {
  id: string;
  mapId: string;
  requestedBy: string | null;
  reviewerId: string | null;
  message: string;
  status: ReviewStatus;
  verdictNote: string | null;
  verdictAt: string | null;
  mapIdentity: string | null;
  pointsDigest: string | null;
  pointCount: number | null;
  outdated: boolean;
  comments: ReviewCommentDto[];
  spotChecks: ServerSpotCheckReport[];
  mailSent?: boolean;
  createdAt: string;
}

export const reviewKeys = {
  map: (projectId: string, mapId: string) => ['projects', projectId, 'maps', mapId, 'reviews'] as const,
  /** The latest review state of every map of a project (get-review-states.ts). */
  project: (projectId: string) => ['projects', projectId, 'reviews'] as const,
};

export const mapPath = (projectId: string, mapId: string) => `/api/projects/${encodeURIComponent(projectId)}/maps/${encodeURIComponent(mapId)}`;
export const reviewPath = (projectId: string, reviewId: string) => `/api/projects/${encodeURIComponent(projectId)}/reviews/${encodeURIComponent(reviewId)}`;

/** GET /api/projects/:projectId/maps/:mapId/reviews (any member). */
export function getReviews(projectId: string, mapId: string, { signal }: { signal?: AbortSignal } = {}): Promise<ReviewDto[]> {
  return apiCall<ReviewDto[]>(`${mapPath(projectId, mapId)}/reviews`, { signal });
}

export const reviewsQueryOptions = (projectId: string, mapId: string) =>
  queryOptions({ queryKey: reviewKeys.map(projectId, mapId), queryFn: ({ signal }) => getReviews(projectId, mapId, { signal }), retry: false });

/**
 * `enabled` false while nobody is signed in (the call would only fail). The reviews are read again
 * after every finished sync round: whether a verdict is outdated is decided by the server from the
 * map's point digest, which a push or pull of new points may just have changed.
 */
export function useReviews(projectId: string, mapId: string, enabled = true) {
  const query = useQuery({ ...reviewsQueryOptions(projectId, mapId), enabled });
  useRefetchAfterSync(query, enabled);
  return query;
}
