import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';
import { projectKeys } from './get-projects.js';

/** DELETE /api/projects/:id/members/:userId — remove a member (owners) or leave (yourself). */
export function removeMember(projectId: string, userId: string): Promise<void> {
  return apiCall<void>(`/api/projects/${encodeURIComponent(projectId)}/members/${encodeURIComponent(userId)}`, { method: 'DELETE' });
}

export function useRemoveMember(projectId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (userId: string) => removeMember(projectId, userId),
    onSuccess: () => client.invalidateQueries({ queryKey: projectKeys.members(projectId) }),
  });
}
