import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';
import type { ProjectRole } from '../../../lib/db.js';
import type { MemberDto } from './get-members.js';
import { projectKeys } from './get-projects.js';

/** PATCH /api/projects/:id/members/:userId (owners; the last owner cannot be demoted: 409). */
export function changeRole(projectId: string, userId: string, role: ProjectRole): Promise<MemberDto> {
  return apiCall<MemberDto>(`/api/projects/${encodeURIComponent(projectId)}/members/${encodeURIComponent(userId)}`, { method: 'PATCH', body: { role } });
}

export function useChangeRole(projectId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, role }: { userId: string; role: ProjectRole }) => changeRole(projectId, userId, role),
    onSuccess: () => client.invalidateQueries({ queryKey: projectKeys.members(projectId) }),
  });
}
