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
 * The state of the latest review (by request time): an open request wins over older verdicts; a
 * verdict whose map gained or changed points since is "outdated", whatever it said.
 */
export function mapReviewState(reviews: readonly Pick<ReviewDto, 'status' | 'outdated' | 'createdAt'>[]): MapReviewState {
  if (reviews.length === 0) return 'none';
  const latest = reviews.reduce((a, b) => (Date.parse(b.createdAt) >= Date.parse(a.createdAt) ? b : a));
  if (latest.status === 'requested') return 'requested';
  return latest.outdated ? 'outdated' : latest.status;
}
