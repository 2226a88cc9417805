import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';
import { reviewKeys, reviewPath, type ReviewDto } from './get-reviews.js';

export interface CommentInput {
  body: string;
  /** A point's key; absent: a comment on the whole map. */
  pointKey?: string;
}

/** POST /api/projects/:projectId/reviews/:id/comments (owners, editors, reviewers). */
export function addComment(projectId: string, reviewId: string, input: CommentInput): Promise<ReviewDto> {
  return apiCall<ReviewDto>(`${reviewPath(projectId, reviewId)}/comments`, { method: 'POST', body: input });
}

export function useAddComment(projectId: string, mapId: string, reviewId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: CommentInput) => addComment(projectId, reviewId, input),
    onSuccess: () => client.invalidateQueries({ queryKey: reviewKeys.map(projectId, mapId) }),
  });
}
