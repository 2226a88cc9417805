import { queryOptions, useQuery } from '@tanstack/react-query';
import { useLiveQuery } from 'dexie-react-hooks';
import { db, type ProjectRecord } from '../../../lib/db.js';
import { fetchAndStoreProjects, type ProjectDto } from '../../../lib/project-store.js';

export type { ProjectDto };

export const projectKeys = {
  all: ['projects'] as const,
  list: () => [...projectKeys.all, 'list'] as const,
  detail: (id: string) => [...projectKeys.all, 'detail', id] as const,
  members: (id: string) => [...projectKeys.all, 'members', id] as const,
  invitations: (id: string) => [...projectKeys.all, 'invitations', id] as const,
};

/** GET /api/projects; the device's copy is kept in step. */
export function getProjects({ signal }: { signal?: AbortSignal } = {}): Promise<ProjectDto[]> {
  return fetchAndStoreProjects(signal);
}

export const projectsQueryOptions = () =>
  queryOptions({
    queryKey: projectKeys.list(),
    queryFn: ({ signal }) => getProjects({ signal }),
    retry: false,
  });

/** Refreshes the projects from the server (when signed in); components read the device copy. */
export function useProjectsRefresh(enabled: boolean) {
  return useQuery({ ...projectsQueryOptions(), enabled });
}

/** The server projects of the signed-in account as stored on this device (works offline). */
export function useStoredProjects(userId: string | undefined): ProjectRecord[] | undefined {
  return useLiveQuery(async () => (userId ? (await db.projects.where('userId').equals(userId).toArray()).sort((a, b) => a.name.localeCompare(b.name)) : []), [userId]);
}

export function useStoredProject(id: string | undefined): ProjectRecord | null | undefined {
  return useLiveQuery(async () => (id ? ((await db.projects.get(id)) ?? null) : null), [id]);
}
