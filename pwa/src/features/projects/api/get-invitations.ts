import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';
import type { ProjectRole } from '../../../lib/db.js';
import { projectKeys } from './get-projects.js';

export interface InvitationDto {
  id: string;
  email: string;
  role: ProjectRole;
  state: 'pending' | 'accepted' | 'revoked' | 'expired';
  expiresAt: string;
  createdAt: string;
  mailSent?: boolean;
}

/** GET /api/projects/:id/invitations (owners), newest first. */
export function getInvitations(projectId: string, { signal }: { signal?: AbortSignal } = {}): Promise<InvitationDto[]> {
  return apiCall<InvitationDto[]>(`/api/projects/${encodeURIComponent(projectId)}/invitations`, { signal });
}

export const invitationsQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: projectKeys.invitations(projectId), queryFn: ({ signal }) => getInvitations(projectId, { signal }), retry: false });

export function useInvitations(projectId: string, enabled = true) {
  return useQuery({ ...invitationsQueryOptions(projectId), enabled });
}
