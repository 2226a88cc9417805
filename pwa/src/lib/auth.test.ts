import { afterEach, describe, expect, it, vi } from 'vitest';
import { apiCall, forgetAccessToken, SignInRequired, startSession } from './auth.js';
import { db } from './db.js';

type Call = { url: string; method: string; auth: string | null; body: unknown };

/** A scripted server: each handler answers one request, in order; every request is recorded. */
function scriptedFetch(handlers: ((c: Call) => Response | Promise<Response>)[]) {
  const calls: Call[] = [];
  const fn = vi.fn(async (url: string, init: RequestInit = {}) => {
    const headers = new Headers(init.headers);
    const call = { url, method: init.method ?? 'GET', auth: headers.get('Authorization'), body: init.body ? (JSON.parse(String(init.body)) as unknown) : undefined };
    calls.push(call);
    const h = handlers.shift();
    if (!h) throw new Error(`unexpected request ${call.method} ${url}`);
    return h(call);
  });
  vi.stubGlobal('fetch', fn);
  return calls;
}

const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
const unauthorized = (reason: string) => json(401, { statusCode: 401, error: 'Unauthorized', message: 'no', details: { reason } });
const user = { id: 'u1', email: 'a@example.org', displayName: 'A', siteRole: 'member' as const };

afterEach(async () => {
  forgetAccessToken();
  await db.session.clear();
});

describe('apiCall', () => {
  it('sends the access token; on token_expired exchanges the refresh token once, stores the new one and repeats the call', async () => {
    await startSession({ accessToken: 'A1', expiresIn: 900, refreshToken: 'R1', refreshExpiresAt: '2099-01-01T00:00:00Z', user });
    const calls = scriptedFetch([
      () => unauthorized('token_expired'),
      () => json(200, { accessToken: 'A2', expiresIn: 900, refreshToken: 'R2', refreshExpiresAt: '2099-01-01T00:00:00Z' }),
      () => json(200, [{ id: 'p' }]),
    ]);
    await expect(apiCall('/api/projects')).resolves.toEqual([{ id: 'p' }]);
    expect(calls.map((c) => [c.method, c.url, c.auth])).toEqual([
      ['GET', '/api/projects', 'Bearer A1'],
      ['POST', '/api/auth/refresh', null],
      ['GET', '/api/projects', 'Bearer A2'],
    ]);
    expect(calls[1].body).toEqual({ refreshToken: 'R1' });
    expect((await db.session.get('current'))?.refreshToken).toBe('R2');
  });

  it('after a reload (no access token in memory) refreshes first; a refused refresh ends the sign-in but keeps the profile', async () => {
    await startSession({ accessToken: 'A1', expiresIn: 900, refreshToken: 'R1', refreshExpiresAt: '2099-01-01T00:00:00Z', user });
    forgetAccessToken();
    const calls = scriptedFetch([() => unauthorized('refresh_reused')]);
    await expect(apiCall('/api/projects')).rejects.toBeInstanceOf(SignInRequired);
    expect(calls.map((c) => c.url)).toEqual(['/api/auth/refresh']);
    const session = await db.session.get('current');
    expect(session?.refreshToken).toBeNull();
    expect(session?.user.email).toBe('a@example.org');
    // Without a refresh token nothing more is sent.
    scriptedFetch([]);
    await expect(apiCall('/api/projects')).rejects.toBeInstanceOf(SignInRequired);
  });

  it('other errors pass through untouched (403 is not a reason to refresh)', async () => {
    await startSession({ accessToken: 'A1', expiresIn: 900, refreshToken: 'R1', refreshExpiresAt: '2099-01-01T00:00:00Z', user });
    const calls = scriptedFetch([() => json(403, { statusCode: 403, error: 'Forbidden', message: 'Only site admins may do this', details: null })]);
    await expect(apiCall('/api/admin/mail')).rejects.toMatchObject({ status: 403, serverMessage: 'Only site admins may do this' });
    expect(calls).toHaveLength(1);
    expect((await db.session.get('current'))?.refreshToken).toBe('R1');
  });

  it('concurrent calls after a reload share one refresh (single flight); the new token is stored before any call uses it', async () => {
    await startSession({ accessToken: 'A1', expiresIn: 900, refreshToken: 'R1', refreshExpiresAt: '2099-01-01T00:00:00Z', user });
    forgetAccessToken();
    const storedWhenUsed: (string | null | undefined)[] = [];
    const answer = async () => {
      storedWhenUsed.push((await db.session.get('current'))?.refreshToken);
      return json(200, []);
    };
    const calls = scriptedFetch([
      () => json(200, { accessToken: 'A2', expiresIn: 900, refreshToken: 'R2', refreshExpiresAt: '2099-01-01T00:00:00Z' }),
      answer,
      answer,
      answer,
    ]);
    await Promise.all([apiCall('/api/projects'), apiCall('/api/projects/p/maps'), apiCall('/api/projects/p/reviews')]);
    expect(calls.filter((c) => c.url === '/api/auth/refresh')).toHaveLength(1);
    expect(calls.filter((c) => c.url !== '/api/auth/refresh').map((c) => c.auth)).toEqual(['Bearer A2', 'Bearer A2', 'Bearer A2']);
    expect(storedWhenUsed).toEqual(['R2', 'R2', 'R2']);
  });
});
