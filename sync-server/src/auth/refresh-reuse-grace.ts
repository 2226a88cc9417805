import { ConfigError } from '../config/app-config.js';

// The grace window rides along in the AccountsConfig (tests set it there); when absent it is read
// from the environment. It belongs to the refresh-token rotation, hence it is declared here.
declare module '../common/accounts-config.js' {
  interface AccountsConfig {
    /**
     * Seconds after its rotation during which a refresh token may be presented once more without
     * counting as reuse (PW_REFRESH_REUSE_GRACE_S, 30; 0 turns the window off). See TokensService.
     */
    refreshReuseGraceS?: number;
  }
}

/** Default grace window in seconds (common practice: tens of seconds, enough for a reload or a slow network). */
export const DEFAULT_REFRESH_REUSE_GRACE_S = 30;

/** The grace window: the configured value, else PW_REFRESH_REUSE_GRACE_S, else 30 s. */
export function refreshReuseGraceS(configured: number | undefined, env: Record<string, string | undefined> = process.env): number {
  if (configured !== undefined) {
    if (!Number.isInteger(configured) || configured < 0 || configured > 3600) {
      throw new ConfigError(`refreshReuseGraceS=${configured} is not a whole number between 0 and 3600`);
    }
    return configured;
  }
  const raw = env.PW_REFRESH_REUSE_GRACE_S;
  if (raw === undefined || raw === '') return DEFAULT_REFRESH_REUSE_GRACE_S;
  const value = Number(raw);
  if (!Number.isInteger(value) || value < 0 || value > 3600) {
    throw new ConfigError(`PW_REFRESH_REUSE_GRACE_S=${raw} is not a whole number between 0 and 3600`);
  }
  return value;
}
