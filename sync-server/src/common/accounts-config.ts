import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { type AppConfig, ConfigError } from '../config/app-config.js';
import { repoRoot } from '../config/repo-paths.js';

/** Settings of accounts, tokens, mail and request limits (environment variables in brackets). */
export interface AccountsConfig {
  /** HMAC secret of access tokens (PW_JWT_SECRET; else generated once into .data/jwt-secret). */
  jwtSecret: string;
  /** Lifetime of an access token in seconds (PW_ACCESS_TOKEN_TTL_S, 900). */
  accessTokenTtlS: number;
  /** Lifetime of a refresh token in seconds (PW_REFRESH_TOKEN_TTL_S, 30 days). */
  refreshTokenTtlS: number;
  /** Lifetime of an invitation link in seconds (PW_INVITATION_TTL_S, 7 days). */
  invitationTtlS: number;
  /** Lifetime of a password-reset link in seconds (PW_RESET_TTL_S, 1 hour). */
  resetTtlS: number;
  /** Lifetime of a project-deletion confirmation token in seconds (PW_DELETE_CONFIRM_TTL_S, 300). */
  deleteConfirmTtlS: number;
  /**
   * scrypt cost of new password hashes: N = 2^log2N (PW_SCRYPT_LOG2N, 15), r = 8, p (PW_SCRYPT_P, 1).
   * Stored hashes name their own parameters, so raising these later keeps old passwords working.
   */
  scrypt: { log2N: number; r: number; p: number };
  /** Origins allowed by CORS (PW_CORS_ORIGIN, comma-separated; default the public URL). */
  corsOrigins: string[];
  /** Address people reach the server (and the PWA) at; links in e-mails start with it. */
  publicUrl: string;
  rateLimit: {
    /** Window in seconds (PW_RATE_LIMIT_WINDOW_S, 900). */
    windowS: number;
    /** Sign-in attempts per window and client address (PW_RATE_LIMIT_SIGN_IN, 30). */
    signIn: number;
    /** Registrations (also invitation acceptances) per window and address (PW_RATE_LIMIT_REGISTER, 10). */
    register: number;
    /** Password-reset requests and resets per window and address (PW_RATE_LIMIT_RESET, 10). */
    reset: number;
  };
  mail: {
    /** Sender of every message (PW_MAIL_FROM). */
    from: string;
    /** SMTP server to send through (PW_SMTP_HOST, 127.0.0.1). */
    smtpHost: string;
    /** Its port (PW_SMTP_PORT, 2525; 0 = any free port, for the built-in fake server only). */
    smtpPort: number;
    /** Run the built-in fake SMTP server on loopback and store what it receives (PW_SMTP_FAKE, 1). */
    fakeServer: boolean;
  };
}

// The accounts settings ride along in the AppConfig given to createApp()/AppModule.register();
// when absent they are read from the environment (loadAccountsConfig).
declare module '../config/app-config.js' {
  interface AppConfig {
    accounts?: AccountsConfig;
  }
}

type Env = Record<string, string | undefined>;

function wholeNumber(env: Env, name: string, fallback: number, min: number, max = Number.MAX_SAFE_INTEGER): number {
  const raw = env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isInteger(value) || value < min || value > max) {
    throw new ConfigError(`${name}=${raw} is not a whole number between ${min} and ${max}`);
  }
  return value;
}

function flag(env: Env, name: string, fallback: boolean): boolean {
  const raw = env[name];
  if (raw === undefined || raw === '') return fallback;
  if (/^(1|true|yes|on)$/i.test(raw)) return true;
  if (/^(0|false|no|off)$/i.test(raw)) return false;
  throw new ConfigError(`${name}=${raw} is not a switch; use 1 or 0`);
}

/** The secret from PW_JWT_SECRET, else the one stored under .data/ (made on first use, mode 600). */
function jwtSecret(env: Env): string {
  const fromEnv = env.PW_JWT_SECRET;
  if (fromEnv !== undefined && fromEnv !== '') {
    if (fromEnv.length < 32) throw new ConfigError('PW_JWT_SECRET is shorter than 32 characters; use a long random value');
    return fromEnv;
  }
  const file = path.join(repoRoot, '.data', 'jwt-secret');
  try {
    const stored = fs.readFileSync(file, 'utf8').trim();
    if (stored.length >= 32) return stored;
  } catch {
    // not made yet
  }
  const secret = randomBytes(48).toString('base64url');
  try {
    fs.mkdirSync(path.dirname(file), { recursive: true });
    fs.writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  } catch (err) {
    throw new ConfigError(`cannot store a generated token secret at ${file} (${(err as Error).message}); set PW_JWT_SECRET`);
  }
  return secret;
}

/** Read the accounts settings from the environment; `app` gives the public URL. */
export function loadAccountsConfig(app: Pick<AppConfig, 'publicUrl'>, env: Env = process.env): AccountsConfig {
  const corsOrigins = (env.PW_CORS_ORIGIN || app.publicUrl)
    .split(',')
    .map((o) => o.trim().replace(/\/$/, ''))
    .filter(Boolean);
  return {
    jwtSecret: jwtSecret(env),
    accessTokenTtlS: wholeNumber(env, 'PW_ACCESS_TOKEN_TTL_S', 900, 10),
    refreshTokenTtlS: wholeNumber(env, 'PW_REFRESH_TOKEN_TTL_S', 30 * 24 * 3600, 60),
    invitationTtlS: wholeNumber(env, 'PW_INVITATION_TTL_S', 7 * 24 * 3600, 60),
    resetTtlS: wholeNumber(env, 'PW_RESET_TTL_S', 3600, 60),
    deleteConfirmTtlS: wholeNumber(env, 'PW_DELETE_CONFIRM_TTL_S', 300, 10),
    scrypt: { log2N: wholeNumber(env, 'PW_SCRYPT_LOG2N', 15, 10, 20), r: 8, p: wholeNumber(env, 'PW_SCRYPT_P', 1, 1, 16) },
    corsOrigins,
    publicUrl: app.publicUrl,
    rateLimit: {
      windowS: wholeNumber(env, 'PW_RATE_LIMIT_WINDOW_S', 900, 1),
      signIn: wholeNumber(env, 'PW_RATE_LIMIT_SIGN_IN', 30, 1),
      register: wholeNumber(env, 'PW_RATE_LIMIT_REGISTER', 10, 1),
      reset: wholeNumber(env, 'PW_RATE_LIMIT_RESET', 10, 1),
    },
    mail: {
      from: env.PW_MAIL_FROM || 'Phasewright <no-reply@phasewright.localhost>',
      smtpHost: env.PW_SMTP_HOST || '127.0.0.1',
      smtpPort: wholeNumber(env, 'PW_SMTP_PORT', 2525, 0, 65535),
      fakeServer: flag(env, 'PW_SMTP_FAKE', true),
    },
  };
}

/** Injection token of the AccountsConfig. */
export const ACCOUNTS_CONFIG = Symbol('ACCOUNTS_CONFIG');
