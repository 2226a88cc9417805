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
  /** The server's own message without the status line (for showing beside a form). */
  readonly serverMessage: string;

  constructor(kind: ApiErrorKind, path: string, message: string, status: number | null = null, details?: unknown, serverMessage?: string) {
    super(message);
    this.serverMessage = serverMessage ?? message;
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

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  /** Sent as JSON. */
  body?: unknown;
  /** Extra headers (e.g. Authorization). */
  headers?: Record<string, string>;
  signal?: AbortSignal;
}

/**
 * Calls the server and returns its JSON (undefined for 204 No Content); `path` starts with /api.
 * Throws ApiError: `offline`/`unreachable` when no answer came, `http` with the server's status,
 * message and details otherwise.
 */
export async function requestJson(path: string, options: RequestOptions = {}): Promise<unknown> {
  let response: Response;
  const headers: Record<string, string> = { Accept: 'application/json', ...options.headers };
  if (options.body !== undefined) headers['Content-Type'] = 'application/json';
  try {
    response = await fetch(path, {
      method: options.method ?? 'GET',
      headers,
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      signal: options.signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    const offline = typeof navigator !== 'undefined' && navigator.onLine === false;
    throw new ApiError(
      offline ? 'offline' : 'unreachable',
      path,
      offline ? 'This device is offline.' : `The server did not answer (${cause instanceof Error ? cause.message : String(cause)}).`,
    );
  }
  if (response.status === 204) return undefined;

  const contentType = response.headers.get('content-type') ?? '';
  const body: unknown = contentType.includes('json') ? await response.json().catch(() => undefined) : undefined;

  if (!response.ok) {
    if (isServerErrorBody(body)) {
      const message = Array.isArray(body.message) ? body.message.join('; ') : body.message;
      throw new ApiError('http', path, `${body.statusCode} ${body.error}: ${message}`, response.status, body.details, message);
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

/** GETs JSON from the server; `path` starts with /api. */
export async function getJson(path: string, init?: { signal?: AbortSignal }): Promise<unknown> {
  return requestJson(path, { signal: init?.signal });
}

/** The reason a 401 gives in `details.reason` (token_expired, token_invalid, refresh_reused, …). */
export function authFailureReason(error: unknown): string | undefined {
  if (!(error instanceof ApiError) || error.status !== 401) return undefined;
  const d = error.details;
  return typeof d === 'object' && d !== null && typeof (d as { reason?: unknown }).reason === 'string' ? (d as { reason: string }).reason : 'unknown';
}

/** A 400's `details` as problems per field path (the validation pipe's shape: [{path, problems}]). */
export function fieldProblems(error: unknown): Record<string, string[]> {
  if (!(error instanceof ApiError) || !Array.isArray(error.details)) return {};
  const out: Record<string, string[]> = {};
  for (const item of error.details as unknown[]) {
    const d = item as { path?: unknown; problems?: unknown };
    if (typeof d.path === 'string' && Array.isArray(d.problems)) out[d.path] = d.problems.filter((p): p is string => typeof p === 'string');
  }
  return out;
}

/** One line for the user: the server's message, or why no answer came. */
export function errorText(error: unknown): string {
  if (error instanceof ApiError) return error.kind === 'http' ? error.serverMessage : error.message;
  return error instanceof Error ? error.message : String(error);
}
