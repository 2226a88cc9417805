import { Injectable } from '@nestjs/common';
import { InjectConnection } from '@nestjs/sequelize';
import { CORE_VERSION } from '@phasewright/physics-core';
import { performance } from 'node:perf_hooks';
import { QueryTypes } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { serverVersion } from '../config/repo-paths.js';
import type { DatabaseInfoDto, HealthReportDto } from './dto/health-report.dto.js';

/** MariaDB's "table doesn't exist" error number. */
const ER_NO_SUCH_TABLE = 1146;

function errno(err: unknown): number | undefined {
  const parent = (err as { parent?: { errno?: number }; original?: { errno?: number } }).parent;
  return parent?.errno;
}

@Injectable()
export class HealthService {
  constructor(@InjectConnection() private readonly sequelize: Sequelize) {}

  async report(): Promise<HealthReportDto> {
    const database = await this.checkDatabase();
    return {
      status: database.status === 'up' && database.schema !== null ? 'ok' : 'degraded',
      server: {
        version: serverVersion,
        uptimeS: Math.round(process.uptime() * 10) / 10,
        node: process.version,
      },
      database,
      core: { version: CORE_VERSION },
    };
  }

  /** Read the schema generation from the real database; a failure to connect means "down". */
  private async checkDatabase(): Promise<DatabaseInfoDto> {
    const t0 = performance.now();
    const latency = () => Math.round((performance.now() - t0) * 100) / 100;
    try {
      const rows = await this.sequelize.query<{ value: string }>(
        "SELECT value FROM schema_info WHERE name = 'schema'",
        { type: QueryTypes.SELECT },
      );
      return { status: 'up', latencyMs: latency(), schema: rows[0]?.value ?? null };
    } catch (err) {
      if (errno(err) === ER_NO_SUCH_TABLE) {
        return {
          status: 'up',
          latencyMs: latency(),
          schema: null,
          error: 'database reachable but not migrated (run `npm start` or `node db/cli.mjs migrate`)',
        };
      }
      return { status: 'down', latencyMs: latency(), schema: null, error: (err as Error).message };
    }
  }
}
