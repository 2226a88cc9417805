import fs from 'node:fs';
import path from 'node:path';
import { repoRoot } from './repo-paths.js';

export interface DatabaseConfig {
  host: string;
  port: number;
  name: string;
  user: string;
  password: string;
  /** Give up connecting after this long, so a down database never stalls a request for long. */
  connectTimeoutMs: number;
}

export interface AppConfig {
  /** HTTP port (PW_PORT, default 8080). */
  port: number;
  /** Interface to bind (PW_HOST, default 127.0.0.1). */
  host: string;
  /** Address people reach the server at (PW_PUBLIC_URL), used in the API docs and links. */
  publicUrl: string;
  /** Folder of the built PWA served at / (PW_PWA_DIST, default <repo>/pwa/dist). */
  pwaDist: string;
  /** Largest accepted request body (PW_BODY_LIMIT, default 10mb). */
  bodyLimit: string;
  db: DatabaseConfig;
}

type Env = Record<string, string | undefined>;

/** Thrown for a bad environment value; the message names the variable and what to do. */
export class ConfigError extends Error {
  override name = 'ConfigError';
}

function port(env: Env, name: string, fallback: number): number {
  const raw = env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isInteger(value) || value < 1 || value > 65535) {
    throw new ConfigError(`${name}=${raw} is not a TCP port; use a whole number between 1 and 65535`);
  }
  return value;
}

interface StoredDb {
  port?: number;
  user?: string;
  password?: string;
  database?: string;
}

/** What `npm run db:start` stored for this checkout (.data/db.json), when present. */
function storedDb(): StoredDb {
  try {
    return JSON.parse(fs.readFileSync(path.join(repoRoot, '.data', 'db.json'), 'utf8')) as StoredDb;
  } catch {
    return {};
  }
}

/**
 * Read the configuration from environment variables. Database settings fall back to what the
 * checkout's db-start script stored in .data/db.json, so a developer can run the server or its
 * tests directly after `npm run db:start`.
 */
export function loadConfig(env: Env = process.env): AppConfig {
  const stored = storedDb();
  const httpPort = port(env, 'PW_PORT', 8080);
  const host = env.PW_HOST || '127.0.0.1';
  return {
    port: httpPort,
    host,
    publicUrl: (env.PW_PUBLIC_URL || `http://${host}:${httpPort}`).replace(/\/$/, ''),
    pwaDist: path.resolve(env.PW_PWA_DIST || path.join(repoRoot, 'pwa', 'dist')),
    bodyLimit: env.PW_BODY_LIMIT || '10mb',
    db: {
      host: env.PW_DB_HOST || '127.0.0.1',
      port: port(env, 'PW_DB_PORT', stored.port ?? 3307),
      name: env.PW_DB_NAME || stored.database || 'phasewright',
      user: env.PW_DB_USER || stored.user || 'phasewright',
      password: env.PW_DB_PASSWORD ?? stored.password ?? '',
      connectTimeoutMs: Number(env.PW_DB_CONNECT_TIMEOUT_MS || 2000),
    },
  };
}
