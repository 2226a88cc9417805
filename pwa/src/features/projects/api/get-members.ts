import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';
import type { ProjectRole } from '../../../lib/db.js';
import { projectKeys } from './get-projects.js';

export interface MemberDto {
  userId: string;
  displayName: string;
  email: string;
  role: ProjectRole;
  since: string;
}

/** GET /api/projects/:id/members (any member). */
export function getMembers(projectId: string, { signal }: { signal?: AbortSignal } = {}): Promise<MemberDto[]> {
  return apiCall<MemberDto[]>(`/api/projects/${encodeURIComponent(projectId)}/members`, { signal });
}

export const membersQueryOptions = (projectId: string) =>
  queryOptions({ queryKey: projectKeys.members(projectId), queryFn: ({ signal }) => getMembers(projectId, { signal }), retry: false });

/** `enabled` false while nobody is signed in (the call would only fail, and the failure would stay cached). */
export function useMembers(projectId: string, enabled = true) {
  return useQuery({ ...membersQueryOptions(projectId), enabled });
}
