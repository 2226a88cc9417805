import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';
import { mapPath, reviewKeys, type ReviewDto } from './get-reviews.js';

export interface RequestReviewInput {
  reviewerId: string;
  message?: string;
}

/** POST /api/projects/:projectId/maps/:mapId/reviews — e-mails the reviewer (owners, editors). */
export function requestReview(projectId: string, mapId: string, input: RequestReviewInput): Promise<ReviewDto> {
  return apiCall<ReviewDto>(`${mapPath(projectId, mapId)}/reviews`, { method: 'POST', body: input });
}

export function useRequestReview(projectId: string, mapId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: RequestReviewInput) => requestReview(projectId, mapId, input),
    onSuccess: () =>
      Promise.all([client.invalidateQueries({ queryKey: reviewKeys.map(projectId, mapId) }), client.invalidateQueries({ queryKey: reviewKeys.project(projectId) })]),
  });
}
