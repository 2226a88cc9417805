/**
 * The device's copy of the signed-in account's server projects (so that project pages open
 * offline and the sync engine knows what to sync), refreshed from GET /api/projects.
 */
import { apiCall, currentSession } from './auth.js';
import { db, type ProjectRecord, type ProjectRole } from './db.js';

/** One project as GET /api/projects returns it. */
export interface ProjectDto {
  id: string;
  name: string;
  description: string;
  archived: boolean;
  archivedAt: string | null;
  createdAt: string;
  updatedAt: string;
  myRole: ProjectRole;
}

export function toProjectRecord(p: ProjectDto, userId: string): ProjectRecord {
  return { id: p.id, name: p.name, description: p.description, myRole: p.myRole, archived: p.archived, updatedAt: Date.parse(p.updatedAt), userId };
}

/** Fetches my projects and keeps the device's copy in step (projects I left disappear from it). */
export async function fetchAndStoreProjects(signal?: AbortSignal): Promise<ProjectDto[]> {
  const list = await apiCall<ProjectDto[]>('/api/projects', { signal });
  const session = await currentSession();
  if (session) {
    const userId = session.user.id;
    await db.transaction('rw', db.projects, async () => {
      const keep = new Set(list.map((p) => p.id));
      const stale = (await db.projects.where('userId').equals(userId).primaryKeys()).filter((id) => !keep.has(id));
      await db.projects.bulkDelete(stale);
      await db.projects.bulkPut(list.map((p) => toProjectRecord(p, userId)));
    });
  }
  return list;
}
