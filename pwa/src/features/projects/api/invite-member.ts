import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';
import type { ProjectRole } from '../../../lib/db.js';
import type { InvitationDto } from './get-invitations.js';
import { projectKeys } from './get-projects.js';

/** POST /api/projects/:id/invitations — e-mails a single-use link (owners). */
export function inviteMember(projectId: string, input: { email: string; role: ProjectRole }): Promise<InvitationDto> {
  return apiCall<InvitationDto>(`/api/projects/${encodeURIComponent(projectId)}/invitations`, { method: 'POST', body: input });
}

export function useInviteMember(projectId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: { email: string; role: ProjectRole }) => inviteMember(projectId, input),
    onSuccess: () => client.invalidateQueries({ queryKey: projectKeys.invitations(projectId) }),
  });
}
