import { useMutation, useQueryClient } from '@tanstack/react-query';
import { requestJson } from '../../../lib/api-client.js';
import { apiCall, startSession } from '../../../lib/auth.js';
import type { ProjectRole } from '../../../lib/db.js';
import { getProjects, projectKeys } from './get-projects.js';

export interface AcceptInput {
  token: string;
  /** Registering while accepting (no account uses the invited address). */
  displayName?: string;
  password?: string;
  /** Accept as the signed-in user. */
  signedIn: boolean;
}

interface Accepted {
  projectId: string;
  role: ProjectRole;
  session?: unknown;
}

/** POST /api/invitations/accept — as the signed-in user, or registering the invited address. */
export async function acceptInvitation(input: AcceptInput): Promise<{ projectId: string; role: ProjectRole }> {
  const body = { token: input.token, ...(input.signedIn ? {} : { displayName: input.displayName, password: input.password }) };
  const result = input.signedIn
    ? await apiCall<Accepted>('/api/invitations/accept', { method: 'POST', body })
    : ((await requestJson('/api/invitations/accept', { method: 'POST', body })) as Accepted);
  if (result.session) await startSession(result.session);
  await getProjects().catch(() => undefined);
  return { projectId: result.projectId, role: result.role };
}

export function useAcceptInvitation() {
  const client = useQueryClient();
  return useMutation({ mutationFn: acceptInvitation, onSuccess: () => client.invalidateQueries({ queryKey: projectKeys.all }) });
}
