import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';
import { mapPath, reviewKeys, type ServerSpotCheckReport } from './get-reviews.js';

export interface ServerSpotCheckInput {
  sample: number;
  seed?: number;
  reviewId?: string;
}

/** POST /api/projects/:projectId/maps/:mapId/spot-checks — the server re-runs K points (owners, editors, reviewers). */
export function runServerSpotCheck(projectId: string, mapId: string, input: ServerSpotCheckInput): Promise<ServerSpotCheckReport> {
  return apiCall<ServerSpotCheckReport>(`${mapPath(projectId, mapId)}/spot-checks`, { method: 'POST', body: input });
}

export function useRunServerSpotCheck(projectId: string, mapId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: ServerSpotCheckInput) => runServerSpotCheck(projectId, mapId, input),
    onSuccess: () => client.invalidateQueries({ queryKey: reviewKeys.map(projectId, mapId) }),
  });
}
