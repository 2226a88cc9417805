// @vitest-environment node
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ApiError } from '../../../lib/api-client.js';
import { getHealth, parseHealth } from './get-health.js';

const report = {
  status: 'ok',
  server: { version: '0.1.0', uptimeS: 12.5, node: 'v20.20.2' },
  database: { status: 'up', latencyMs: 2.4 },
  core: { version: '0.1.0' },
};

function stubFetch(body: string, init: ResponseInit): void {
  vi.stubGlobal('fetch', vi.fn(async () => new Response(body, init)));
}

afterEach(() => vi.unstubAllGlobals());

describe('parseHealth', () => {
  it('accepts a full report and keeps the database error when down', () => {
    expect(parseHealth(report).database).toEqual({ status: 'up', latencyMs: 2.4 });
    const down = parseHealth({ ...report, database: { status: 'down', latencyMs: null, error: 'connect ECONNREFUSED' } });
    expect(down.database).toEqual({ status: 'down', latencyMs: null, error: 'connect ECONNREFUSED' });
  });

  it('names the field that does not fit', () => {
    expect(() => parseHealth({ ...report, database: { status: 'maybe', latencyMs: 1 } })).toThrow(
      /field "database\.status" should be "up" or "down"/,
    );
    expect(() => parseHealth({ ...report, server: { ...report.server, uptimeS: 'long' } })).toThrow(/"server\.uptimeS"/);
    expect(() => parseHealth([])).toThrow(/field "\$" should be an object/);
  });
});

describe('getHealth', () => {
  it('returns the parsed report from a JSON answer', async () => {
    stubFetch(JSON.stringify(report), { status: 200, headers: { 'content-type': 'application/json' } });
    await expect(getHealth()).resolves.toMatchObject({ database: { status: 'up' }, core: { version: '0.1.0' } });
  });

  it('reports a static host answering with HTML as an invalid response', async () => {
    stubFetch('<!doctype html><title>x</title>', { status: 200, headers: { 'content-type': 'text/html' } });
    const error = await getHealth().catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).kind).toBe('invalid-response');
  });

  it('reports a refused connection as unreachable and a gateway error likewise', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))));
    await expect(getHealth()).rejects.toMatchObject({ kind: 'unreachable' });
    stubFetch('Bad Gateway', { status: 502, headers: { 'content-type': 'text/plain' } });
    await expect(getHealth()).rejects.toMatchObject({ kind: 'unreachable', status: 502 });
  });

  it('carries the server error shape through', async () => {
    stubFetch(JSON.stringify({ statusCode: 503, error: 'Service Unavailable', message: 'shutting down', details: null }), {
      status: 503,
      headers: { 'content-type': 'application/json' },
    });
    await expect(getHealth()).rejects.toMatchObject({ kind: 'http', status: 503, message: '503 Service Unavailable: shutting down' });
  });
});
