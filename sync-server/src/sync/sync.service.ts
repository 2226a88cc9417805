import { BadRequestException, ConflictException, Inject, Injectable, Logger, PayloadTooLargeException } from '@nestjs/common';
import { InjectConnection } from '@nestjs/sequelize';
import {
  CORE_VERSION,
  canonicalJson,
  mapIdentity,
  mergeMaps,
  parseModelSpec,
  parseOwnedMap,
  parseSweepSpec,
  type MapPoint,
  type PhaseMap,
  SpecError,
} from '@phasewright/physics-core';
import { QueryTypes, Transaction } from 'sequelize';
import type { Sequelize } from 'sequelize-typescript';
import type { ProjectAccess } from '../common/auth-user.js';
import { assembleMap, MAP_COLUMNS, type MapRow, mergedText, normaliseMapRow, pointsDigest, sha256 } from '../maps/map-rows.js';
import { MapsService } from '../maps/maps.service.js';
import { type BlockEntry, decodeBlockAsync, encodeBlockAsync, type PointBlock, type PointPlaces, placePoints, placesOf } from '../maps/point-blocks.js';
import type { PullChange, PushResponse, PushResult } from './dto/sync.dto.js';
import { SYNC_CONFIG, type SyncConfig } from './sync-config.js';
import { retryOnDeadlock } from '../database/deadlock-retry.js';
import {
  type ChangeInput,
  checkEnvelope,
  checkHumanRecord,
  checkPointsOnSweep,
  inputError,
  type InputIssue,
  pointsIn,
  type RecordKind,
  specIssues,
} from './sync-input.js';

/** A change after the checks that need no database (maps parsed by physics-core). */
type Prepared = { change: ChangeInput; index: number; map?: PhaseMap };

/** Bytes of block rows per driver batch (the server's max_allowed_packet is 16 MiB). */
const BLOCK_BYTES_PER_BATCH = 4 * 1024 * 1024;

/** Push and pull of a project's models, sweeps, maps, points, annotations and notes. */
@Injectable()
export class SyncService {
  private readonly logger = new Logger('Sync');

  constructor(
    @InjectConnection() private readonly sequelize: Sequelize,
    @Inject(SYNC_CONFIG) private readonly config: SyncConfig,
    private readonly maps: MapsService,
  ) {}

  /**
   * Applies a batch in one transaction, or replays the stored response of a batch already
   * applied. Pushes of one project are serialised by a row lock on its change counter, so merges
   * of concurrent pushes see each other's points.
   */
  async push(access: ProjectAccess, userId: string, body: unknown, contentLength: number | undefined): Promise<{ response: PushResponse; replayed: boolean }> {
    if (contentLength !== undefined && contentLength > this.config.maxBatchBytes) {
      throw new PayloadTooLargeException({
        message: `This push is ${contentLength} bytes; the limit is ${this.config.maxBatchBytes} bytes per batch (PW_SYNC_MAX_BATCH_BYTES): push the map in several batches (a "map" change, then "points" changes)`,
        details: { bytes: contentLength, limit: this.config.maxBatchBytes },
      });
    }
    const input = checkEnvelope(body, this.config.maxChangesPerBatch);
    const points = input.changes.reduce((n, c) => n + pointsIn(c), 0);
    if (points > this.config.maxPointsPerBatch) {
      throw new PayloadTooLargeException({
        message: `This batch carries ${points} points; the limit is ${this.config.maxPointsPerBatch} points per batch (PW_SYNC_MAX_POINTS_PER_BATCH): split the points over several batches`,
        details: { points, limit: this.config.maxPointsPerBatch },
      });
    }
    const [project] = await this.sequelize.query<{ archivedAt: Date | null }>('SELECT archived_at AS archivedAt FROM projects WHERE id = ?', { type: QueryTypes.SELECT, replacements: [access.projectId] });
    if (project?.archivedAt) throw new ConflictException({ message: 'The project is archived (read-only); an owner can unarchive it', details: { reason: 'archived' } });
    const prepared = this.prepare(input.changes);
    return retryOnDeadlock(() =>
      this.sequelize.transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.READ_COMMITTED }, (tx) => this.apply(access.projectId, userId, input.batchId, prepared, tx)),
    );
  }

  /** Checks that need no database: models and sweeps by physics-core, maps by parseMap + identity + sweep domain. */
  private prepare(changes: ChangeInput[]): Prepared[] {
    const t0 = performance.now();
    const issues: InputIssue[] = [];
    const out = changes.map((change, index): Prepared => {
      const path = `changes[${index}].data`;
      const p: Prepared = { change, index };
      const spec = (check: () => unknown, at: string) => {
        try {
          check();
        } catch (error) {
          if (error instanceof SpecError) issues.push(...specIssues(error, at));
          else throw error;
        }
      };
      switch (change.kind) {
        case 'model':
          if (change.data.spec !== undefined) spec(() => parseModelSpec(change.data.spec, { integerParticles: false }), `${path}.spec`);
          break;
        case 'sweep':
          if (change.data.spec !== undefined) spec(() => parseSweepSpec(change.data.spec), `${path}.spec`);
          break;
        case 'annotation':
        case 'note':
          issues.push(...checkHumanRecord(change.kind, change.data, path));
          break;
        case 'map': {
          const before = issues.length;
          spec(() => (p.map = parseOwnedMap(change.data)), path); // the request body is ours: no copy
          if (issues.length > before || !p.map) break;
          issues.push(...checkIdentity(p.map, path));
          issues.push(...checkPointsOnSweep(p.map, path));
          break;
        }
        case 'points':
          if (typeof change.data.points !== 'object' || change.data.points === null || Array.isArray(change.data.points)) {
            issues.push({ path: `${path}.points`, message: 'must be an object of points keyed by point key' });
          }
          break;
      }
      return p;
    });
    if (issues.length > 0) throw inputError(issues);
    this.logger.verbose(`checked ${changes.length} changes in ${(performance.now() - t0).toFixed(0)} ms`);
    return out;
  }

  private async apply(projectId: string, userId: string, batchId: string, prepared: Prepared[], tx: Transaction): Promise<{ response: PushResponse; replayed: boolean }> {
    const q = <T extends object>(sql: string, replacements: unknown[]) => this.sequelize.query<T>(sql, { type: QueryTypes.SELECT, replacements, transaction: tx });
    const run = (sql: string, replacements: unknown[]) => this.sequelize.query(sql, { replacements, transaction: tx });
    // The project's change counter, locked until commit: pushes of one project run one at a time.
    await run('INSERT INTO project_sync_state (project_id, last_seq) VALUES (?, 0) ON DUPLICATE KEY UPDATE last_seq = last_seq', [projectId]);
    const [state] = await q<{ lastSeq: number }>('SELECT last_seq AS lastSeq FROM project_sync_state WHERE project_id = ? FOR UPDATE', [projectId]);
    const done = await q<{ response: string }>('SELECT response FROM sync_batches WHERE project_id = ? AND batch_id = ?', [projectId, batchId]);
    if (done.length > 0) return { response: JSON.parse(done[0].response) as PushResponse, replayed: true };

    let seq = Number(state.lastSeq);
    const next = () => ++seq;
    const results: PushResult[] = [];
    const conflicts: unknown[] = [];
    const issues: InputIssue[] = [];
    for (const p of prepared) {
      const { change } = p;
      if (change.kind === 'map' || change.kind === 'points') {
        const r = await this.applyMap(projectId, userId, p, tx, next, issues);
        if (r) results.push(r);
      } else {
        const r = await this.applyRecord(projectId, userId, p.index, change, change.kind, tx, next, conflicts);
        if (r) results.push(r);
      }
    }
    if (issues.length > 0) throw inputError(issues);
    if (conflicts.length > 0) {
      throw new ConflictException({
        message: `${conflicts.length} edit${conflicts.length > 1 ? 's were' : ' was'} based on a stale revision; nothing in this batch was stored. Each conflict carries your version and the server's: merge them and push again with the server's revision as baseRevision`,
        details: { conflicts },
      });
    }
    await run('UPDATE project_sync_state SET last_seq = ? WHERE project_id = ?', [seq, projectId]);
    const response: PushResponse = { batchId, cursor: seq, results };
    await run('INSERT INTO sync_batches (project_id, batch_id, user_id, response) VALUES (?, ?, ?, ?)', [projectId, batchId, userId, JSON.stringify(response)]);
    return { response, replayed: false };
  }

  private async applyRecord(
    projectId: string,
    userId: string,
    index: number,
    change: ChangeInput,
    kind: RecordKind,
    tx: Transaction,
    next: () => number,
    conflicts: unknown[],
  ): Promise<PushResult | undefined> {
    const rows = await this.sequelize.query<{ kind: string; revision: number; data: string; updatedBy: string | null; updatedAt: Date }>(
      'SELECT kind, revision, data, updated_by AS updatedBy, updated_at AS updatedAt FROM sync_records WHERE project_id = ? AND id = ? FOR UPDATE',
      { type: QueryTypes.SELECT, replacements: [projectId, change.id], transaction: tx },
    );
    const text = canonicalJson(change.data);
    const current = rows[0];
    if (!current) {
      if ((change.baseRevision ?? 0) !== 0) {
        conflicts.push({ kind, id: change.id, baseRevision: change.baseRevision, yours: change.data, theirs: null, reason: 'the server has no revision of this record' });
        return undefined;
      }
      const s = next();
      await this.sequelize.query('INSERT INTO sync_records (project_id, id, kind, revision, seq, data, updated_by) VALUES (?, ?, ?, 1, ?, ?, ?)', {
        replacements: [projectId, change.id, kind, s, text, userId],
        transaction: tx,
      });
      return { kind, id: change.id, status: 'created', revision: 1, seq: s };
    }
    if (current.kind !== kind) {
      throw inputError([{ path: `changes[${index}].kind`, message: `record ${change.id} is a ${current.kind}, not a ${kind}` }]);
    }
    if (current.data === text) return { kind, id: change.id, status: 'unchanged', revision: current.revision };
    if (change.baseRevision !== current.revision) {
      conflicts.push({
        kind,
        id: change.id,
        baseRevision: change.baseRevision ?? null,
        yours: change.data,
        theirs: { revision: current.revision, data: JSON.parse(current.data) as unknown, updatedBy: current.updatedBy, updatedAt: current.updatedAt },
      });
      return undefined;
    }
    const s = next();
    await this.sequelize.query('UPDATE sync_records SET revision = revision + 1, seq = ?, data = ?, updated_by = ?, updated_at = CURRENT_TIMESTAMP(3) WHERE project_id = ? AND id = ?', {
      replacements: [s, text, userId, projectId, change.id],
      transaction: tx,
    });
    return { kind, id: change.id, status: 'updated', revision: current.revision + 1, seq: s };
  }

  /**
   * A map (metadata and points) or more points of a stored map: loads the stored points of the
   * same keys, merges with physics-core's mergeMaps, writes the points whose merged result changed.
   */
  private async applyMap(projectId: string, userId: string, p: Prepared, tx: Transaction, next: () => number, issues: InputIssue[]): Promise<PushResult | undefined> {
    const { change } = p;
    const path = `changes[${p.index}].data`;
    const find = async (column: 'id' | 'identity', value: string) => {
      const rows = await this.sequelize.query<Record<string, unknown>>(`SELECT ${MAP_COLUMNS} FROM maps WHERE project_id = ? AND ${column} = ? FOR UPDATE`, {
        type: QueryTypes.SELECT,
        replacements: [projectId, value],
        transaction: tx,
      });
      return rows[0] ? normaliseMapRow(rows[0]) : undefined;
    };
    const byId = await find('id', change.id);
    let incoming: PhaseMap;
    let row: MapRow | undefined;
    if (change.kind === 'points') {
      if (!byId) {
        issues.push({ path: `changes[${p.index}].id`, message: `no map ${change.id} in this project; push the map (kind "map") first, in this batch or an earlier one` });
        return undefined;
      }
      row = byId;
      try {
        incoming = parseOwnedMap({ ...assembleMap(byId, {}), points: change.data.points });
      } catch (error) {
        if (!(error instanceof SpecError)) throw error;
        issues.push(...specIssues(error, path));
        return undefined;
      }
      const off = checkPointsOnSweep(incoming, path);
      if (off.length > 0) {
        issues.push(...off);
        return undefined;
      }
    } else {
      incoming = p.map as PhaseMap;
      if (byId && byId.identity !== incoming.id) {
        issues.push({ path: `${path}.id`, message: `map ${change.id} holds identity ${byId.identity.slice(0, 12)}…, this one is ${incoming.id.slice(0, 12)}… (another model, sweep, solver options or core version): give it a new id` });
        return undefined;
      }
      row = byId ?? (await find('identity', incoming.id));
    }

    const keys = Object.keys(incoming.points);
    let merged: PhaseMap;
    // The map's blocks (keys and hashes of all; texts of those holding pushed keys and of the last).
    const blocks = new Map<number, PointBlock>();
    let where: PointPlaces = new Map();
    const stored = new Map<string, string>();
    // The stored points of the pushed keys, parsed from those texts.
    let storedPoints: Record<string, MapPoint> = {};
    const t0 = performance.now();
    let tLoaded = t0;
    if (row) {
      const directory = await this.maps.directory(row.pk, tx);
      where = placesOf(directory);
      for (const b of directory) blocks.set(b.blockNo, b);
      const needed = new Set<number>();
      let fresh = false;
      for (const key of keys) {
        const at = where.get(key);
        if (at) needed.add(at.blockNo);
        else fresh = true;
      }
      if (fresh && directory.length > 0) needed.add(directory[directory.length - 1].blockNo);
      await this.maps.withTexts(row.pk, [...needed].map((no) => blocks.get(no) as PointBlock), tx);
      const points: Record<string, MapPoint> = {};
      for (const key of keys) {
        const at = where.get(key);
        if (!at) continue;
        const text = (blocks.get(at.blockNo) as PointBlock).entries[at.index].text as string;
        stored.set(key, text);
        points[key] = JSON.parse(text) as MapPoint;
      }
      tLoaded = performance.now();
      storedPoints = points;
      // A stored map without any point (a sweep created and pushed before it ran) contributes no
      // run to the provenance: its only source is the placeholder's, which would stay "unfinished".
      // (With points stored, `points` holds only those under the pushed keys: the header merges whole.)
      merged = row.pointCount > 0 ? mergeMaps([assembleMap(row, points), incoming]) : mergeMaps([incoming]);
    } else {
      merged = mergeMaps([incoming]);
    }
    const t1 = performance.now();
    const sweepText = canonicalJson(merged.sweep);
    const provenanceText = canonicalJson(merged.provenance);
    let pk: number;
    if (!row) {
      const s = next();
      await this.sequelize.query(
        'INSERT INTO maps (project_id, id, identity, method, name, sweep, provenance, point_count, points_digest, seq, created_by, updated_by) VALUES (?, ?, ?, ?, ?, ?, ?, 0, ?, ?, ?, ?)',
        { replacements: [projectId, change.id, merged.id, merged.sweep.method, merged.sweep.name ?? null, sweepText, provenanceText, pointsDigest([]), s, userId, userId], transaction: tx },
      );
      const [created] = await this.sequelize.query<{ pk: number }>('SELECT pk FROM maps WHERE project_id = ? AND id = ?', { type: QueryTypes.SELECT, replacements: [projectId, change.id], transaction: tx });
      pk = Number(created.pk);
    } else {
      pk = row.pk;
    }

    // Points whose merged result differs from what is stored.
    let added = 0;
    let updated = 0;
    let disputed = 0;
    const changed: BlockEntry[] = [];
    for (const key of keys) {
      const point = merged.points[key];
      const before = stored.get(key);
      const text = mergedText(point, storedPoints[key], before);
      if (before === text) continue;
      const hash = sha256(text);
      if (before === undefined) added++;
      else updated++;
      if (point.disputed?.length) disputed++;
      changed.push({ key, hash, text });
    }
    const touched = placePoints(blocks, where, changed);
    const t2 = performance.now();
    // The driver's batch (one prepared statement, rows sent in bulk) on the transaction's own
    // connection, in parts of at most ~4 MB (below the server's max_allowed_packet).
    const connection = (tx as unknown as { connection: { batch(sql: string, values: unknown[][]): Promise<unknown> } }).connection;
    let part: unknown[][] = [];
    let bytes = 0;
    const flush = async () => {
      if (part.length === 0) return;
      await connection.batch(
        'INSERT INTO map_point_blocks (map_pk, block_no, project_id, seq, point_count, point_keys, data) VALUES (?, ?, ?, ?, ?, ?, ?) ' +
          'ON DUPLICATE KEY UPDATE seq = VALUES(seq), point_count = VALUES(point_count), point_keys = VALUES(point_keys), data = VALUES(data)',
        part,
      );
      part = [];
      bytes = 0;
    };
    // Compressed on the thread pool, all blocks at once (in parallel with each other).
    const encodedBlocks = await Promise.all(touched.map((blockNo) => encodeBlockAsync((blocks.get(blockNo) as PointBlock).entries)));
    for (let i = 0; i < touched.length; i++) {
      const blockNo = touched[i];
      const encoded = encodedBlocks[i];
      part.push([pk, blockNo, projectId, next(), (blocks.get(blockNo) as PointBlock).entries.length, encoded.keys, encoded.data]);
      bytes += encoded.keys.length + encoded.data.byteLength;
      if (bytes > BLOCK_BYTES_PER_BATCH) await flush();
    }
    await flush();

    const metadataChanged = !row || row.sweep !== sweepText || row.provenance !== provenanceText;
    if (changed.length > 0 || metadataChanged) {
      const digest = pointsDigest([...blocks.values()].flatMap((b) => b.entries.map((e): [string, string] => [e.key, e.hash])));
      await this.sequelize.query(
        'UPDATE maps SET sweep = ?, provenance = ?, name = ?, point_count = ?, points_digest = ?, seq = ?, updated_by = ?, updated_at = CURRENT_TIMESTAMP(3) WHERE pk = ?',
        { replacements: [sweepText, provenanceText, merged.sweep.name ?? null, where.size, digest, next(), userId, pk], transaction: tx },
      );
    }
    const t3 = performance.now();
    this.logger.verbose(`map ${change.id}: ${keys.length} points; load ${(tLoaded - t0).toFixed(0)} ms (read, inflate, parse), merge ${(t1 - tLoaded).toFixed(0)} ms, canonical texts + hashes ${(t2 - t1).toFixed(0)} ms, write ${changed.length} points in ${touched.length} blocks + digest ${(t3 - t2).toFixed(0)} ms`);
    const storedAs = row && row.id !== change.id ? row.id : undefined;
    const status = !row ? 'created' : changed.length > 0 || metadataChanged ? 'merged' : 'unchanged';
    return { kind: change.kind, id: change.id, status, ...(storedAs ? { storedAs } : {}), points: { received: keys.length, added, updated, unchanged: keys.length - added - updated, disputed } };
  }

  /**
   * Changes after `after`, oldest first, as the JSON text of a PullResponse: records and maps count
   * one each, blocks of points their point count; a page holds whole blocks, at most `limit` points
   * and records unless its first block alone is larger. A points change groups consecutive blocks of one map.
   */
  async pull(projectId: string, after: number, limit: number): Promise<string> {
    if (limit > this.config.maxPullLimit) throw new BadRequestException({ message: `limit must be at most ${this.config.maxPullLimit}`, details: [{ path: 'limit', problems: [`limit must not be greater than ${this.config.maxPullLimit}`] }] });
    return this.sequelize.transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.REPEATABLE_READ }, async (tx) => {
      const q = <T extends object>(sql: string) => this.sequelize.query<T>(sql, { type: QueryTypes.SELECT, replacements: [projectId, after, limit + 1], transaction: tx });
      /** A record or map change (weight 1) or a block of points (weight: its point count, data read later). */
      type Item = { seq: number; change?: PullChange; mapId?: string; points?: number };
      const items: Item[] = [];
      for (const r of await q<{ id: string; kind: RecordKind; revision: number; seq: number; data: string; updatedBy: string | null; updatedAt: Date }>(
        'SELECT id, kind, revision, seq, data, updated_by AS updatedBy, updated_at AS updatedAt FROM sync_records WHERE project_id = ? AND seq > ? ORDER BY seq LIMIT ?',
      )) {
        items.push({ seq: Number(r.seq), change: { seq: Number(r.seq), kind: r.kind, id: r.id, revision: r.revision, data: JSON.parse(r.data) as Record<string, unknown>, updatedBy: r.updatedBy, updatedAt: r.updatedAt } });
      }
      for (const raw of await q<Record<string, unknown>>(`SELECT ${MAP_COLUMNS} FROM maps WHERE project_id = ? AND seq > ? ORDER BY seq LIMIT ?`)) {
        const m = normaliseMapRow(raw);
        items.push({ seq: m.seq, change: { seq: m.seq, kind: 'map', id: m.id, data: assembleMap(m, {}) as unknown as Record<string, unknown>, pointCount: m.pointCount, pointsDigest: m.pointsDigest, updatedBy: m.updatedBy, updatedAt: m.updatedAt } });
      }
      for (const r of await q<{ mapId: string; seq: number; n: number }>(
        'SELECT m.id AS mapId, b.seq, b.point_count AS n FROM map_point_blocks b JOIN maps m ON m.pk = b.map_pk WHERE b.project_id = ? AND b.seq > ? ORDER BY b.seq LIMIT ?',
      )) {
        items.push({ seq: Number(r.seq), mapId: r.mapId, points: Number(r.n) });
      }
      items.sort((a, b) => a.seq - b.seq);
      // A page holds whole blocks: items while their weight fits the limit (at least one item). It
      // never skips an unread row: each kind was read up to limit + 1 rows, more than a page holds.
      let weight = 0;
      let end = 0;
      while (end < items.length) {
        const w = items[end].points ?? 1;
        if (end > 0 && weight + w > limit) break;
        weight += w;
        end++;
      }
      const hasMore = end < items.length;
      const page = items.slice(0, end);
      const blockSeqs = page.flatMap((i) => (i.points === undefined ? [] : [i.seq]));
      const texts = new Map<number, PointBlock>();
      if (blockSeqs.length > 0) {
        const rows = await this.sequelize.query<{ seq: number; k: string; d: Buffer }>('SELECT seq, point_keys AS k, data AS d FROM map_point_blocks WHERE project_id = ? AND seq IN (?)', {
          type: QueryTypes.SELECT,
          replacements: [projectId, blockSeqs],
          transaction: tx,
        });
        // Inflated on the thread pool, in parallel.
        const decoded = await Promise.all(rows.map((r) => decodeBlockAsync(-1, r.k, r.d)));
        rows.forEach((r, i) => texts.set(Number(r.seq), decoded[i]));
      }
      // Points travel as their stored canonical texts, spliced into the response text (no parse and
      // re-stringify of every point); `raw` holds them per points change.
      const changes: PullChange[] = [];
      const raw = new Map<PullChange, BlockEntry[]>();
      for (const item of page) {
        if (item.change) {
          changes.push(item.change);
          continue;
        }
        const last = changes.at(-1);
        const entries = (texts.get(item.seq) as PointBlock).entries;
        if (last && last.kind === 'points' && last.id === item.mapId) {
          (raw.get(last) as BlockEntry[]).push(...entries);
          last.seq = item.seq;
        } else {
          const c: PullChange = { seq: item.seq, kind: 'points', id: item.mapId as string, data: {} };
          changes.push(c);
          raw.set(c, [...entries]);
        }
      }
      // A map's metadata row is rewritten (new seq) whenever its points change, so it may sort after
      // points of the same map: send the latest metadata before the first points of a map whose
      // metadata the client has not seen yet (a repeat of the later change is harmless).
      const seen = new Set<string>();
      const missing = new Set<string>();
      for (const c of changes) {
        if (c.kind === 'map') seen.add(c.id);
        else if (c.kind === 'points' && !seen.has(c.id)) missing.add(c.id);
      }
      if (missing.size > 0) {
        const metas = new Map<string, PullChange>();
        for (const raw of await this.sequelize.query<Record<string, unknown>>(`SELECT ${MAP_COLUMNS} FROM maps WHERE project_id = ? AND id IN (?) AND seq > ?`, { type: QueryTypes.SELECT, replacements: [projectId, [...missing], after], transaction: tx })) {
          const m = normaliseMapRow(raw);
          metas.set(m.id, { seq: m.seq, kind: 'map', id: m.id, data: assembleMap(m, {}) as unknown as Record<string, unknown>, pointCount: m.pointCount, pointsDigest: m.pointsDigest, updatedBy: m.updatedBy, updatedAt: m.updatedAt });
        }
        for (let i = 0; i < changes.length; i++) {
          const meta = changes[i].kind === 'points' ? metas.get(changes[i].id) : undefined;
          if (meta) {
            changes.splice(i, 0, meta);
            metas.delete(meta.id);
            i++;
          }
        }
      }
      const [state] = await this.sequelize.query<{ lastSeq: number }>('SELECT last_seq AS lastSeq FROM project_sync_state WHERE project_id = ?', { type: QueryTypes.SELECT, replacements: [projectId], transaction: tx });
      const cursor = hasMore ? page[page.length - 1].seq : Math.max(after, Number(state?.lastSeq ?? 0));
      const parts = changes.map((c) => {
        const entries = raw.get(c);
        if (!entries) return JSON.stringify(c);
        const points = entries.map((e) => `${JSON.stringify(e.key)}:${e.text as string}`).join(',');
        return `{"seq":${c.seq},"kind":"points","id":${JSON.stringify(c.id)},"data":{"points":{${points}}}}`;
      });
      return `{"changes":[${parts.join(',')}],"cursor":${cursor},"hasMore":${hasMore}}`;
    });
  }
}

/** A map's id must be physics-core's identity of its sweep and core version. */
function checkIdentity(map: PhaseMap, path: string): InputIssue[] {
  const expected = mapIdentity(map.sweep, map.provenance.coreVersion);
  if (expected === map.id) return [];
  const note = map.provenance.coreVersion !== CORE_VERSION ? ` (computed with core version ${map.provenance.coreVersion}, as the map says)` : '';
  return [{ path: `${path}.id`, message: `does not match the identity of the map's sweep and core version: expected ${expected}${note}; the map was altered or hashed wrongly` }];
}
