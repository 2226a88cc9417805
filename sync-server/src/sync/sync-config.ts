import { ConfigService } from '@nestjs/config';
import { availableParallelism } from 'node:os';
import { type AppConfig, ConfigError } from '../config/app-config.js';

/** Bounds of map sync, spot-checks and uploads (environment variables in brackets). */
export interface SyncConfig {
  /** Points per push batch, over all its changes (PW_SYNC_MAX_POINTS_PER_BATCH, 10000). */
  maxPointsPerBatch: number;
  /** Changes per push batch (PW_SYNC_MAX_CHANGES_PER_BATCH, 1000). */
  maxChangesPerBatch: number;
  /**
   * Bytes per push request (PW_SYNC_MAX_BATCH_BYTES, 9 MiB). Keep it below the app-wide body limit
   * (PW_BODY_LIMIT): bodies above that are refused by the body parser before they reach sync.
   */
  maxBatchBytes: number;
  /** Largest page a pull may ask for (PW_SYNC_MAX_PULL, 10000 rows); the default page is 2000. */
  maxPullLimit: number;
  spotCheck: {
    /** Points re-run per spot-check (PW_SPOT_CHECK_MAX_SAMPLE, 32). */
    maxSample: number;
    /** Spot-checks one user may have running at once (PW_SPOT_CHECK_PER_USER, 1). */
    perUser: number;
    /** Spot-checks running at once on the server (PW_SPOT_CHECK_MAX_RUNNING, 2). */
    maxRunning: number;
    /** Worker threads per spot-check (PW_SPOT_CHECK_WORKERS, cores − 1, at most 4). */
    workers: number;
    /** A spot-check still running after this long is stopped (PW_SPOT_CHECK_TIMEOUT_S, 300). */
    timeoutS: number;
  };
  uploads: {
    /** Largest uploaded file in bytes (PW_UPLOAD_MAX_BYTES, 5 MiB). */
    maxBytes: number;
  };
}

declare module '../config/app-config.js' {
  interface AppConfig {
    sync?: SyncConfig;
  }
}

type Env = Record<string, string | undefined>;

function whole(env: Env, name: string, fallback: number, min: number, max: number): number {
  const raw = env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isInteger(value) || value < min || value > max) throw new ConfigError(`${name}=${raw} is not a whole number between ${min} and ${max}`);
  return value;
}

export function loadSyncConfig(env: Env = process.env): SyncConfig {
  const MiB = 1024 * 1024;
  return {
    maxPointsPerBatch: whole(env, 'PW_SYNC_MAX_POINTS_PER_BATCH', 10_000, 1, 1_000_000),
    maxChangesPerBatch: whole(env, 'PW_SYNC_MAX_CHANGES_PER_BATCH', 1000, 1, 100_000),
    maxBatchBytes: whole(env, 'PW_SYNC_MAX_BATCH_BYTES', 9 * MiB, 1024, 1024 * MiB),
    maxPullLimit: whole(env, 'PW_SYNC_MAX_PULL', 10_000, 1, 1_000_000),
    spotCheck: {
      maxSample: whole(env, 'PW_SPOT_CHECK_MAX_SAMPLE', 32, 1, 10_000),
      perUser: whole(env, 'PW_SPOT_CHECK_PER_USER', 1, 1, 100),
      maxRunning: whole(env, 'PW_SPOT_CHECK_MAX_RUNNING', 2, 1, 100),
      workers: whole(env, 'PW_SPOT_CHECK_WORKERS', Math.max(1, Math.min(4, availableParallelism() - 1)), 1, 64),
      timeoutS: whole(env, 'PW_SPOT_CHECK_TIMEOUT_S', 300, 1, 86_400),
    },
    uploads: { maxBytes: whole(env, 'PW_UPLOAD_MAX_BYTES', 5 * MiB, 1024, 1024 * MiB) },
  };
}

/** Injection token of the SyncConfig. */
export const SYNC_CONFIG = Symbol('SYNC_CONFIG');

/** The provider: the AppConfig's `sync` block when given (tests), else the environment. */
export const syncConfigProvider = {
  provide: SYNC_CONFIG,
  inject: [ConfigService],
  useFactory: (cs: ConfigService): SyncConfig => cs.getOrThrow<AppConfig>('app').sync ?? loadSyncConfig(),
};
