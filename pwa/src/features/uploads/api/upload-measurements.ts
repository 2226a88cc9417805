import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ApiError } from '../../../lib/api-client.js';
import { accessToken } from '../../../lib/auth.js';
import { uploadKeys, uploadsPath, type UploadDto } from './get-uploads.js';

/** One problem the server found in a CSV (details of its 400). */
export interface CsvProblem {
  line: number | null;
  column: number | null;
  problem: string;
}

export function csvProblems(error: unknown): CsvProblem[] {
  if (!(error instanceof ApiError) || !Array.isArray(error.details)) return [];
  return (error.details as Partial<CsvProblem>[]).filter((d): d is CsvProblem => typeof d?.problem === 'string').map((d) => ({ line: d.line ?? null, column: d.column ?? null, problem: d.problem }));
}

/** POST /api/projects/:projectId/uploads/measurements (multipart, field "file"; owners, editors). */
export async function uploadMeasurements(projectId: string, input: { file: File; mapId?: string }): Promise<UploadDto> {
  const path = `${uploadsPath(projectId)}/measurements`;
  const form = new FormData();
  form.append('file', input.file, input.file.name);
  if (input.mapId) form.append('mapId', input.mapId);
  const token = await accessToken(path);
  let response: Response;
  try {
    response = await fetch(path, { method: 'POST', headers: { Authorization: `Bearer ${token}`, Accept: 'application/json' }, body: form });
  } catch (cause) {
    throw new ApiError(navigator.onLine ? 'unreachable' : 'offline', path, navigator.onLine ? `The server did not answer (${String(cause)}).` : 'This device is offline.');
  }
  const body: unknown = await response.json().catch(() => undefined);
  if (!response.ok) {
    const b = body as { statusCode?: number; error?: string; message?: string | string[]; details?: unknown } | undefined;
    const message = Array.isArray(b?.message) ? b.message.join('; ') : (b?.message ?? `HTTP ${response.status}`);
    throw new ApiError('http', path, `${response.status} ${b?.error ?? ''}: ${message}`, response.status, b?.details, message);
  }
  return body as UploadDto;
}


export function useUploadMeasurements(projectId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: { file: File; mapId?: string }) => uploadMeasurements(projectId, input),
    onSuccess: () => client.invalidateQueries({ queryKey: uploadKeys.project(projectId) }),
  });
}
