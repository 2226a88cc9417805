import type { LoggerService } from '@nestjs/common';
import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import type { App } from 'supertest/types.js';
import { createApp } from '../../src/app.js';
import type { AccountsConfig } from '../../src/common/accounts-config.js';
import { type DatabaseConfig, loadConfig } from '../../src/config/app-config.js';
import type { SyncConfig } from '../../src/sync/sync-config.js';

/** Clearly test-only secret (never used outside these tests). */
export const TEST_ONLY_JWT_SECRET = 'test-only-secret-not-for-any-real-server-0123456789';

/**
 * Settings for tests: a fixed test-only secret, a free port for the fake SMTP server, rate limits
 * high enough not to interfere, and a cheaper scrypt cost (N = 2^12; hashes name their own cost,
 * so the production code path is the same).
 */
export function testAccountsConfig(overrides: Partial<AccountsConfig> = {}): AccountsConfig {
  const publicUrl = 'http://127.0.0.1:8080';
  return {
    jwtSecret: TEST_ONLY_JWT_SECRET,
    accessTokenTtlS: 900,
    refreshTokenTtlS: 3600,
    invitationTtlS: 3600,
    resetTtlS: 3600,
    deleteConfirmTtlS: 300,
    scrypt: { log2N: 12, r: 8, p: 1 },
    corsOrigins: [publicUrl],
    publicUrl,
    rateLimit: { windowS: 900, signIn: 10_000, register: 10_000, reset: 10_000 },
    mail: { from: 'Phasewright test <no-reply@phasewright.test>', smtpHost: '127.0.0.1', smtpPort: 0, fakeServer: true },
    ...overrides,
  };
}

/** Collects every line the Nest logger writes (all levels), for the "no secrets in logs" check. */
export class CapturingLogger implements LoggerService {
  readonly lines: string[] = [];
  private add(level: string, message: unknown, rest: unknown[]) {
    this.lines.push(`${level} ${[message, ...rest].map((x) => (typeof x === 'string' ? x : JSON.stringify(x))).join(' ')}`);
  }
  log(message: unknown, ...rest: unknown[]) { this.add('log', message, rest); }
  error(message: unknown, ...rest: unknown[]) { this.add('error', message, rest); }
  warn(message: unknown, ...rest: unknown[]) { this.add('warn', message, rest); }
  debug(message: unknown, ...rest: unknown[]) { this.add('debug', message, rest); }
  verbose(message: unknown, ...rest: unknown[]) { this.add('verbose', message, rest); }
  fatal(message: unknown, ...rest: unknown[]) { this.add('fatal', message, rest); }
}

export interface TestApp {
  app: NestExpressApplication;
  http: App;
  logger: CapturingLogger;
  accounts: AccountsConfig;
  close(): Promise<void>;
}

/** The app on a test database, its log captured; `sync` replaces the sync limits (defaults from the environment). */
export async function startTestApp(db: DatabaseConfig, overrides: Partial<AccountsConfig> = {}, sync?: SyncConfig): Promise<TestApp> {
  const accounts = testAccountsConfig(overrides);
  const logger = new CapturingLogger();
  const app = await createApp({ ...loadConfig(), db, accounts, publicUrl: accounts.publicUrl, ...(sync ? { sync } : {}) }, { logger: false });
  app.useLogger(logger);
  await app.init();
  return { app, http: app.getHttpServer() as App, logger, accounts, close: () => app.close() };
}

export interface Session {
  accessToken: string;
  refreshToken: string;
  user: { id: string; email: string; displayName: string; siteRole: string };
}

/** Register through the API and return the session (expects 201). */
export async function register(http: App, email: string, displayName: string, password: string): Promise<Session> {
  const res = await request(http).post('/api/auth/register').send({ email, displayName, password });
  if (res.status !== 201) throw new Error(`register ${email}: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as Session;
}

export async function signIn(http: App, email: string, password: string): Promise<Session> {
  const res = await request(http).post('/api/auth/sign-in').send({ email, password });
  if (res.status !== 200) throw new Error(`sign in ${email}: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as Session;
}

export const bearer = (s: Session | string) => `Bearer ${typeof s === 'string' ? s : s.accessToken}`;

export interface StoredMail {
  id: number;
  to: string;
  subject: string;
  text: string;
  html: string;
  links: string[];
}

/** The token in a link such as http://…/invitations/accept#token=… */
export function tokenOf(link: string): string {
  const token = new URLSearchParams(new URL(link).hash.slice(1)).get('token');
  if (!token) throw new Error(`no token in ${link}`);
  return token;
}
