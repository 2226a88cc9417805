import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiCall, currentSession } from '../../../lib/auth.js';
import { db } from '../../../lib/db.js';
import { toProjectRecord, type ProjectDto } from '../../../lib/project-store.js';
import { projectKeys } from './get-projects.js';

export interface CreateProjectInput {
  name: string;
  description?: string;
}

/** POST /api/projects — I become the owner. Needs the server (projects get their ids there). */
export async function createProject(input: CreateProjectInput): Promise<ProjectDto> {
  const project = await apiCall<ProjectDto>('/api/projects', { method: 'POST', body: input });
  const session = await currentSession();
  if (session) await db.projects.put(toProjectRecord(project, session.user.id));
  return project;
}

export function useCreateProject() {
  const client = useQueryClient();
  return useMutation({ mutationFn: createProject, onSuccess: () => client.invalidateQueries({ queryKey: projectKeys.list() }) });
}
