import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';
import { reviewKeys, reviewPath, type ReviewDto } from './get-reviews.js';

export interface VerdictInput {
  verdict: 'approved' | 'changes-requested';
  note: string;
}

/** POST /api/projects/:projectId/reviews/:id/verdict (only the requested reviewer). */
export function giveVerdict(projectId: string, reviewId: string, input: VerdictInput): Promise<ReviewDto> {
  return apiCall<ReviewDto>(`${reviewPath(projectId, reviewId)}/verdict`, { method: 'POST', body: input });
}

export function useGiveVerdict(projectId: string, mapId: string, reviewId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: VerdictInput) => giveVerdict(projectId, reviewId, input),
    onSuccess: () =>
      Promise.all([client.invalidateQueries({ queryKey: reviewKeys.map(projectId, mapId) }), client.invalidateQueries({ queryKey: reviewKeys.project(projectId) })]),
  });
}
