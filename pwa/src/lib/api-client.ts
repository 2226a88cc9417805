/**
 * The one way the PWA calls the sync server. Errors come back as ApiError with a `kind`
 * the UI can explain: the browser is offline, the server cannot be reached, or the server
 * answered with an error (its body has one shape: statusCode, error, message, details).
 */
export type ApiErrorKind = 'offline' | 'unreachable' | 'http' | 'invalid-response';

export class ApiError extends Error {
  readonly kind: ApiErrorKind;
  readonly status: number | null;
  readonly path: string;
  readonly details: unknown;

  constructor(kind: ApiErrorKind, path: string, message: string, status: number | null = null, details?: unknown) {
    super(message);
    this.name = 'ApiError';
    this.kind = kind;
    this.path = path;
    this.status = status;
    this.details = details;
  }
}

/** Server error body (the one error shape of the sync server). */
interface ServerErrorBody {
  statusCode: number;
  error: string;
  message: string | string[];
  details?: unknown;
}

function isServerErrorBody(value: unknown): value is ServerErrorBody {
  return (
    typeof value === 'object' &&
    value !== null &&
    typeof (value as { statusCode?: unknown }).statusCode === 'number' &&
    typeof (value as { message?: unknown }).message !== 'undefined'
  );
}

/** Status codes a gateway or dev proxy returns when the server behind it is not running. */
const GATEWAY_STATUSES = new Set([502, 503, 504]);

/** GETs JSON from the server; `path` starts with /api. */
export async function getJson(path: string, init?: { signal?: AbortSignal }): Promise<unknown> {
  let response: Response;
  try {
    response = await fetch(path, { headers: { Accept: 'application/json' }, signal: init?.signal });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    const offline = typeof navigator !== 'undefined' && navigator.onLine === false;
    throw new ApiError(
      offline ? 'offline' : 'unreachable',
      path,
      offline ? 'This device is offline.' : `The server did not answer (${cause instanceof Error ? cause.message : String(cause)}).`,
    );
  }

  const contentType = response.headers.get('content-type') ?? '';
  const body: unknown = contentType.includes('json') ? await response.json().catch(() => undefined) : undefined;

  if (!response.ok) {
    if (isServerErrorBody(body)) {
      const message = Array.isArray(body.message) ? body.message.join('; ') : body.message;
      throw new ApiError('http', path, `${body.statusCode} ${body.error}: ${message}`, response.status, body.details);
    }
    if (GATEWAY_STATUSES.has(response.status) || response.status === 500) {
      throw new ApiError('unreachable', path, `The server behind ${path} is not answering (HTTP ${response.status}).`, response.status);
    }
    throw new ApiError('http', path, `HTTP ${response.status} from ${path}.`, response.status);
  }
  if (body === undefined) {
    // A static host (e.g. `vite preview` without a server) answers /api with index.html.
    throw new ApiError('invalid-response', path, `${path} did not return JSON; is the sync server running behind this address?`, response.status);
  }
  return body;
}
