/**
 * The signed-in account. The user profile and the refresh token live in Dexie (so the app knows
 * who is signed in after a reload, offline too); the access token lives only in this module's
 * memory. Calls to the server go through `apiCall`, which adds the access token, and on a 401
 * whose `details.reason` is token_expired (or when no access token is in memory yet, e.g. after a
 * reload) exchanges the refresh token once and repeats the call.
 *
 * Refresh tokens are single use and the server revokes the whole sign-in when one is presented
 * twice, so refreshes are serialised across tabs with a Web Lock and always use the token stored
 * last (another tab may have rotated it meanwhile). Within one tab, concurrent calls share one
 * refresh (`refreshing`), and the new refresh token is written to Dexie before any caller continues.
 * A reload between the server's rotation and that write is covered by the server's grace window:
 * the old token, presented again within seconds, returns the same new one instead of counting as reuse.
 */
import { useLiveQuery } from 'dexie-react-hooks';
import { ApiError, authFailureReason, requestJson, type RequestOptions } from './api-client.js';
import { db, type SessionRecord } from './db.js';

export type SessionUser = SessionRecord['user'];

/** What sign-in, register and accept-invitation return. */
export interface SessionResponse {
  accessToken: string;
  expiresIn: number;
  refreshToken: string;
  refreshExpiresAt: string;
  user: SessionUser & { createdAt?: string };
}

interface Access {
  token: string;
  /** ms since the epoch, with a margin. */
  expiresAt: number;
  userId: string;
}

let access: Access | null = null;
let refreshing: Promise<Access | null> | null = null;

function isSessionResponse(x: unknown): x is SessionResponse {
  const s = x as Partial<SessionResponse> | null;
  return typeof s === 'object' && s !== null && typeof s.accessToken === 'string' && typeof s.refreshToken === 'string' && typeof s.user?.id === 'string';
}

function rememberAccess(token: string, expiresIn: number, userId: string): Access {
  access = { token, expiresAt: Date.now() + Math.max(0, expiresIn - 30) * 1000, userId };
  return access;
}

/** Stores a new session (after sign-in, registration or accepting an invitation). */
export async function startSession(response: unknown): Promise<SessionUser> {
  if (!isSessionResponse(response)) throw new ApiError('invalid-response', '/api/auth', 'The server answered without a session.');
  const { id, email, displayName, siteRole } = response.user;
  const user: SessionUser = { id, email, displayName, siteRole };
  await db.session.put({ id: 'current', user, refreshToken: response.refreshToken, refreshExpiresAt: response.refreshExpiresAt, signedInAt: Date.now() });
  rememberAccess(response.accessToken, response.expiresIn, id);
  return user;
}

/** The session stored on this device (undefined: none). */
export async function currentSession(): Promise<SessionRecord | undefined> {
  return db.session.get('current');
}

/** Live: the signed-in user, `null` when signed out, `undefined` while loading. */
export function useSession(): SessionRecord | null | undefined {
  return useLiveQuery(async () => (await db.session.get('current')) ?? null, []);
}

async function withRefreshLock<T>(fn: () => Promise<T>): Promise<T> {
  if (typeof navigator !== 'undefined' && 'locks' in navigator && navigator.locks) {
    return navigator.locks.request('phasewright-refresh', fn) as Promise<T>;
  }
  return fn();
}

/** Exchanges the stored refresh token; null when there is none or the server refused it. */
async function refreshAccess(): Promise<Access | null> {
  refreshing ??= withRefreshLock(async () => {
    const session = await currentSession();
    if (!session?.refreshToken) return null;
    try {
      const pair = (await requestJson('/api/auth/refresh', { method: 'POST', body: { refreshToken: session.refreshToken } })) as Partial<SessionResponse>;
      if (typeof pair.accessToken !== 'string' || typeof pair.refreshToken !== 'string' || typeof pair.expiresIn !== 'number') {
        throw new ApiError('invalid-response', '/api/auth/refresh', 'The refresh answer has no tokens.');
      }
      await db.session.update('current', { refreshToken: pair.refreshToken, refreshExpiresAt: pair.refreshExpiresAt ?? null });
      return rememberAccess(pair.accessToken, pair.expiresIn, session.user.id);
    } catch (error) {
      if (authFailureReason(error)) {
        // The sign-in is over (expired, revoked, reused): keep the profile for the local space, drop the token.
        await db.session.update('current', { refreshToken: null });
        access = null;
        return null;
      }
      throw error;
    }
  }).finally(() => {
    refreshing = null;
  });
  return refreshing;
}

/** Thrown by apiCall when the user must sign in (again) before talking to the server. */
export class SignInRequired extends ApiError {
  constructor(path: string, reason: string) {
    super('http', path, `Sign in again to reach the server (${reason}).`, 401, { reason }, 'Sign in again to reach the server.');
    this.name = 'SignInRequired';
  }
}

/** An authenticated call: adds the access token, refreshes it once on token_expired. */
export async function apiCall<T = unknown>(path: string, options: RequestOptions = {}): Promise<T> {
  const session = await currentSession();
  if (!session) throw new SignInRequired(path, 'not signed in');
  let current = access && access.userId === session.user.id && access.expiresAt > Date.now() ? access : null;
  if (!current) {
    current = await refreshAccess();
    if (!current) throw new SignInRequired(path, 'the sign-in has ended');
  }
  const send = (token: string) => requestJson(path, { ...options, headers: { ...options.headers, Authorization: `Bearer ${token}` } });
  try {
    return (await send(current.token)) as T;
  } catch (error) {
    const reason = authFailureReason(error);
    if (reason !== 'token_expired' && reason !== 'token_invalid') throw error;
    access = null;
    const next = await refreshAccess();
    if (!next) throw new SignInRequired(path, reason);
    return (await send(next.token)) as T;
  }
}

/** A valid access token for a call `fetch` makes itself (file downloads, multipart uploads); refreshes when needed. */
export async function accessToken(path: string): Promise<string> {
  const session = await currentSession();
  if (!session) throw new SignInRequired(path, 'not signed in');
  const current = access && access.userId === session.user.id && access.expiresAt > Date.now() ? access : await refreshAccess();
  if (!current) throw new SignInRequired(path, 'the sign-in has ended');
  return current.token;
}

/** Signs out on this device (and on the server when reachable); local data stays. */
export async function signOut(): Promise<void> {
  const session = await currentSession();
  access = null;
  await db.session.delete('current');
  if (session?.refreshToken) {
    await requestJson('/api/auth/sign-out', { method: 'POST', body: { refreshToken: session.refreshToken } }).catch(() => undefined);
  }
}

/** For tests: forget the in-memory access token (as a reload would). */
export function forgetAccessToken(): void {
  access = null;
}
