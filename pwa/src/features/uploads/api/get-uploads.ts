import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';
import type { MeasurementsSummary } from '../../maps/lib/measurements.js';

export interface UploadDto {
  id: string;
  kind: 'measurements' | 'lattice';
  fileName: string;
  contentType: string;
  size: number;
  sha256: string;
  mapId: string | null;
  uploadedBy: string | null;
  createdAt: string;
  summary?: unknown;
}

export const uploadKeys = {
  project: (projectId: string) => ['projects', projectId, 'uploads'] as const,
  one: (projectId: string, id: string) => ['projects', projectId, 'uploads', id] as const,
};

export const uploadsPath = (projectId: string) => `/api/projects/${encodeURIComponent(projectId)}/uploads`;

/** GET /api/projects/:projectId/uploads — the project's uploads, newest first (any member). */
export function getUploads(projectId: string, { signal }: { signal?: AbortSignal } = {}): Promise<UploadDto[]> {
  return apiCall<UploadDto[]>(uploadsPath(projectId), { signal });
}

export const uploadsQueryOptions = (projectId: string) => queryOptions({ queryKey: uploadKeys.project(projectId), queryFn: ({ signal }) => getUploads(projectId, { signal }), retry: false });

export function useUploads(projectId: string) {
  return useQuery(uploadsQueryOptions(projectId));
}

/** Whether an upload's summary is the server's reading of a measurements CSV. */
export function isMeasurementsSummary(x: unknown): x is MeasurementsSummary {
  const s = x as Partial<MeasurementsSummary> | null;
  return typeof s === 'object' && s !== null && Array.isArray(s.rows) && Array.isArray(s.parameters);
}
