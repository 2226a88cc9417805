import { queryOptions, useQuery } from '@tanstack/react-query';
import { ApiError, getJson } from '../../../lib/api-client.js';

/** GET /api/health — what the sync server reports about itself and its database. */
export interface Health {
  /** Overall verdict of the server, e.g. "ok" or "degraded". */
  status: string;
  server: { version: string; uptimeS: number; node: string };
  database: { status: 'up' | 'down'; latencyMs: number | null; error?: string };
  core: { version: string };
}

export const HEALTH_PATH = '/api/health';

export const healthKeys = {
  all: ['health'] as const,
  detail: () => [...healthKeys.all, 'detail'] as const,
};

function fail(field: string, expected: string): never {
  throw new ApiError('invalid-response', HEALTH_PATH, `${HEALTH_PATH}: field "${field}" should be ${expected}.`);
}

function record(value: unknown, field: string): Record<string, unknown> {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) fail(field, 'an object');
  return value as Record<string, unknown>;
}

function text(value: unknown, field: string): string {
  if (typeof value !== 'string') fail(field, 'a string');
  return value;
}

function finite(value: unknown, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) fail(field, 'a finite number');
  return value;
}

/** Checks the response shape and names the first field that does not fit. */
export function parseHealth(json: unknown): Health {
  const root = record(json, '$');
  const server = record(root.server, 'server');
  const database = record(root.database, 'database');
  const core = record(root.core, 'core');
  const dbStatus = database.status;
  if (dbStatus !== 'up' && dbStatus !== 'down') fail('database.status', '"up" or "down"');
  const latency = database.latencyMs;
  return {
    status: text(root.status, 'status'),
    server: {
      version: text(server.version, 'server.version'),
      uptimeS: finite(server.uptimeS, 'server.uptimeS'),
      node: text(server.node, 'server.node'),
    },
    database: {
      status: dbStatus,
      latencyMs: latency === null || latency === undefined ? null : finite(latency, 'database.latencyMs'),
      ...(database.error === undefined ? {} : { error: text(database.error, 'database.error') }),
    },
    core: { version: text(core.version, 'core.version') },
  };
}

export async function getHealth({ signal }: { signal?: AbortSignal } = {}): Promise<Health> {
  return parseHealth(await getJson(HEALTH_PATH, { signal }));
}

export const healthQueryOptions = () =>
  queryOptions({
    queryKey: healthKeys.detail(),
    queryFn: ({ signal }) => getHealth({ signal }),
    // A health report is only useful fresh; poll gently while the page is open.
    staleTime: 0,
    refetchInterval: 15_000,
    retry: false,
  });

export function useHealth() {
  return useQuery(healthQueryOptions());
}
