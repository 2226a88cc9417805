import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';
import { uploadKeys, uploadsPath, type UploadDto } from './get-uploads.js';

/** GET /api/projects/:projectId/uploads/:id — one upload with what the server read from it (any member). */
export function getUpload(projectId: string, id: string, { signal }: { signal?: AbortSignal } = {}): Promise<UploadDto> {
  return apiCall<UploadDto>(`${uploadsPath(projectId)}/${encodeURIComponent(id)}`, { signal });
}

export const uploadQueryOptions = (projectId: string, id: string) =>
  queryOptions({ queryKey: uploadKeys.one(projectId, id), queryFn: ({ signal }) => getUpload(projectId, id, { signal }), retry: false, staleTime: Infinity, enabled: !!id });

export function useUpload(projectId: string, id: string | undefined) {
  return useQuery(uploadQueryOptions(projectId, id ?? ''));
}
