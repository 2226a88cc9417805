import type { ReviewDto } from '../api/get-reviews.js';

/** Where a map stands with its reviews, for lists and filters. */
export type MapReviewState = 'none' | 'requested' | 'approved' | 'changes-requested' | 'outdated';

export const REVIEW_STATE_TEXT: Record<MapReviewState, string> = {
  none: 'not reviewed',
  requested: 'review requested',
  approved: 'approved',
  'changes-requested': 'changes requested',
  outdated: 'verdict outdated',
};

/**
 * The state of the latest review (by request time) decided from a map's full review list (the map
 * page has it). The project-wide list comes decided by the server (GET /api/projects/:id/reviews,
 * sync-server/src/reviews/reviews.service.ts reviewStateOf) with the same rule: an open request wins over older verdicts; a
 * verdict whose map gained or changed points since is "outdated", whatever it said.
 */
export function mapReviewState(reviews: readonly Pick<ReviewDto, 'status' | 'outdated' | 'createdAt'>[]): MapReviewState {
  if (reviews.length === 0) return 'none';
  const latest = reviews.reduce((a, b) => (Date.parse(b.createdAt) >= Date.parse(a.createdAt) ? b : a));
  if (latest.status === 'requested') return 'requested';
  return latest.outdated ? 'outdated' : latest.status;
}

/** A map's review state for lists: the state, its words and a tooltip naming reviewer and time. */
export interface MapReviewStateInfo {
  state: MapReviewState;
  text: string;
  detail?: string;
}

/**
 * Review states for the maps stored on this device, from the server's project-wide list. A map the
 * server does not know yet (still in the outbox) has no review: "none".
 */
export function reviewStatesByMap(
  localMapIds: readonly string[],
  serverStates: readonly { mapId: string; state: MapReviewState; reviewerName: string | null; updatedAt: string | null; pointCount: number }[],
): Record<string, MapReviewStateInfo> {
  const byId = new Map(serverStates.map((s) => [s.mapId.toLowerCase(), s]));
  const out: Record<string, MapReviewStateInfo> = {};
  for (const id of localMapIds) {
    const s = byId.get(id.toLowerCase());
    const state = s?.state ?? 'none';
    const parts: string[] = [];
    if (s && state !== 'none') {
      if (s.reviewerName) parts.push(`reviewer ${s.reviewerName}`);
      if (s.updatedAt) parts.push(`updated ${new Date(s.updatedAt).toLocaleString()}`);
      parts.push(`${s.pointCount} points on the server`);
    }
    out[id] = parts.length > 0 ? { state, text: REVIEW_STATE_TEXT[state], detail: parts.join(' · ') } : { state, text: REVIEW_STATE_TEXT[state] };
  }
  return out;
}
