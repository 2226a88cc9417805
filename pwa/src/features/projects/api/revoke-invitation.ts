import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';
import { projectKeys } from './get-projects.js';

/** DELETE /api/projects/:id/invitations/:invitationId — the link stops working (owners). */
export function revokeInvitation(projectId: string, invitationId: string): Promise<void> {
  return apiCall<void>(`/api/projects/${encodeURIComponent(projectId)}/invitations/${encodeURIComponent(invitationId)}`, { method: 'DELETE' });
}

export function useRevokeInvitation(projectId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => revokeInvitation(projectId, invitationId),
    onSuccess: () => client.invalidateQueries({ queryKey: projectKeys.invitations(projectId) }),
  });
}
