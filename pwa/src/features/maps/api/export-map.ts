import { ApiError, requestJson } from '../../../lib/api-client.js';
import { accessToken } from '../../../lib/auth.js';

export type ServerExport = 'package.json' | 'points.csv' | 'methods.txt';

/** GET /api/projects/:projectId/maps/:mapId/export/<file> (any member): the file and its name. */
export async function downloadServerExport(projectId: string, mapId: string, file: ServerExport): Promise<{ blob: Blob; name: string }> {
  const path = `/api/projects/${encodeURIComponent(projectId)}/maps/${encodeURIComponent(mapId)}/export/${file}`;
  const token = await accessToken(path);
  let response: Response;
  try {
    response = await fetch(path, { headers: { Authorization: `Bearer ${token}` } });
  } catch (cause) {
    throw new ApiError(navigator.onLine ? 'unreachable' : 'offline', path, navigator.onLine ? `The server did not answer (${String(cause)}).` : 'This device is offline.');
  }
  if (!response.ok) {
    // Repeat through the JSON client to get the server's error message in the usual shape.
    await requestJson(path, { headers: { Authorization: `Bearer ${token}` } });
    throw new ApiError('http', path, `HTTP ${response.status} from ${path}.`, response.status);
  }
  const disposition = response.headers.get('content-disposition') ?? '';
  const name = /filename="([^"]+)"/.exec(disposition)?.[1] ?? file;
  return { blob: await response.blob(), name };
}
