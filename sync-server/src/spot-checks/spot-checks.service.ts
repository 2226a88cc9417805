import { BadRequestException, HttpException, HttpStatus, Inject, Injectable, NotFoundException, type OnModuleDestroy } from '@nestjs/common';
import { InjectConnection } from '@nestjs/sequelize';
import { compareSpotCheck, CORE_VERSION, type MapPoint, samplePointKeys, spotCheckJobs, type SweepSpec } from '@phasewright/physics-core';
import { randomUUID } from 'node:crypto';
import os from 'node:os';
import { QueryTypes } from 'sequelize';
import type { Sequelize } from 'sequelize-typescript';
import type { ProjectAccess } from '../common/auth-user.js';
import { serverVersion } from '../config/repo-paths.js';
import { MapsService } from '../maps/maps.service.js';
import { SYNC_CONFIG, type SyncConfig } from '../sync/sync-config.js';
import type { RunSpotCheckDto, SpotCheckReportDto } from './dto/spot-check.dto.js';
import { SpotCheckPool } from './spot-check-runner.js';

/** Re-runs sampled points of a stored map with physics-core in worker threads and stores the report. */
@Injectable()
export class SpotChecksService implements OnModuleDestroy {
  private readonly running = new Map<string, number>();
  private total = 0;
  /** Worker threads kept between spot-checks (started on first use). */
  private readonly pool = new SpotCheckPool();

  constructor(
    @InjectConnection() private readonly sequelize: Sequelize,
    @Inject(SYNC_CONFIG) private readonly config: SyncConfig,
    private readonly maps: MapsService,
  ) {}

  async onModuleDestroy(): Promise<void> {
    await this.pool.close();
  }

  async run(access: ProjectAccess, userId: string, mapId: string, body: RunSpotCheckDto): Promise<SpotCheckReportDto> {
    const limits = this.config.spotCheck;
    if (body.sample > limits.maxSample) {
      throw new BadRequestException({ message: `sample must be at most ${limits.maxSample} points per spot-check (PW_SPOT_CHECK_MAX_SAMPLE)`, details: [{ path: 'sample', problems: [`sample must not be greater than ${limits.maxSample}`] }] });
    }
    if ((this.running.get(userId) ?? 0) >= limits.perUser) {
      throw new HttpException({ message: `You already have ${limits.perUser} spot-check${limits.perUser > 1 ? 's' : ''} running (PW_SPOT_CHECK_PER_USER); wait for it to finish`, details: { running: limits.perUser } }, HttpStatus.TOO_MANY_REQUESTS);
    }
    if (this.total >= limits.maxRunning) {
      throw new HttpException({ message: `The server is running ${limits.maxRunning} spot-checks already (PW_SPOT_CHECK_MAX_RUNNING); try again in a minute`, details: null }, HttpStatus.TOO_MANY_REQUESTS);
    }
    // Counted before the first await, so parallel requests see each other.
    this.running.set(userId, (this.running.get(userId) ?? 0) + 1);
    this.total++;
    try {
      const row = await this.maps.find(access.projectId, mapId);
      if (body.reviewId) {
        const r = await this.sequelize.query('SELECT id FROM reviews WHERE id = ? AND map_pk = ?', { type: QueryTypes.SELECT, replacements: [body.reviewId, row.pk] });
        if (r.length === 0) throw new NotFoundException({ message: 'No such review of this map', details: null });
      }
      return await this.execute(access.projectId, userId, row.pk, row.id, JSON.parse(row.sweep) as SweepSpec, body);
    } finally {
      this.total--;
      const left = (this.running.get(userId) ?? 1) - 1;
      if (left > 0) this.running.set(userId, left);
      else this.running.delete(userId);
    }
  }

  private async execute(projectId: string, userId: string, mapPk: number, mapId: string, sweep: SweepSpec, body: RunSpotCheckDto): Promise<SpotCheckReportDto> {
    const seed = body.seed ?? 1;
    const allKeys = await this.maps.keys(mapPk);
    if (allKeys.length === 0) throw new BadRequestException({ message: 'The map has no points to re-run yet', details: null });
    const keys = samplePointKeys(allKeys, body.sample, seed);
    const stored = await this.maps.points(mapPk, keys);
    const runtime = { kind: 'node' as const, version: process.version, cores: os.availableParallelism() };
    const jobs = spotCheckJobs(sweep, stored, keys, runtime);
    const t0 = performance.now();
    const events = await this.pool.run(jobs, this.config.spotCheck.workers, this.config.spotCheck.timeoutS * 1000);
    const totalMs = performance.now() - t0;
    const fresh = new Map<string, MapPoint>();
    const failures = new Map<string, string>();
    for (const e of events) {
      if (e.kind === 'point') fresh.set(e.key, e.point);
      else failures.set(e.key, e.message);
    }
    // The rule every spot-check uses (physics-core), so the CLI, the browser and the server agree.
    const comparison = compareSpotCheck(sweep.method, stored, fresh, failures);
    const pointsMs = comparison.points.reduce((sum, p) => sum + (p.wallMs ?? 0), 0);
    const report = {
      ...comparison,
      seed,
      timing: { totalMs: Math.round(totalMs), pointsMs: Math.round(pointsMs), workers: Math.min(this.config.spotCheck.workers, keys.length) },
      runtime: { node: process.version, platform: `${process.platform}-${process.arch}`, cpus: os.availableParallelism(), coreVersion: CORE_VERSION, serverVersion },
    };
    const id = randomUUID();
    await this.sequelize.query('INSERT INTO spot_checks (id, project_id, map_pk, review_id, requested_by, sample, seed, pass, report) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)', {
      replacements: [id, projectId, mapPk, body.reviewId ?? null, userId, keys.length, seed, report.pass, JSON.stringify(report)],
    });
    return { id, mapId, reviewId: body.reviewId ?? null, requestedBy: userId, createdAt: new Date(), ...report };
  }

  /** Stored reports of a map (newest first), optionally only those of one review. */
  async list(projectId: string, mapId: string, reviewId?: string): Promise<SpotCheckReportDto[]> {
    const row = await this.maps.find(projectId, mapId);
    const rows = await this.sequelize.query<{ id: string; reviewId: string | null; requestedBy: string | null; createdAt: Date; report: string }>(
      `SELECT id, review_id AS reviewId, requested_by AS requestedBy, created_at AS createdAt, report FROM spot_checks WHERE map_pk = ?${reviewId ? ' AND review_id = ?' : ''} ORDER BY created_at DESC, id`,
      { type: QueryTypes.SELECT, replacements: reviewId ? [row.pk, reviewId] : [row.pk] },
    );
    return rows.map((r) => ({ id: r.id, mapId: row.id, reviewId: r.reviewId, requestedBy: r.requestedBy, createdAt: r.createdAt, ...(JSON.parse(r.report) as Omit<SpotCheckReportDto, 'id' | 'mapId' | 'reviewId' | 'requestedBy' | 'createdAt'>) }));
  }
}
