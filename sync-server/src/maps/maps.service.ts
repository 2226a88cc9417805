import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectConnection } from '@nestjs/sequelize';
import type { MapPoint, PhaseMap } from '@phasewright/physics-core';
import { QueryTypes, type Transaction } from 'sequelize';
import type { Sequelize } from 'sequelize-typescript';
import type { MapSummaryDto } from './dto/map.dto.js';
import { assembleMap, MAP_COLUMNS, type MapRow, normaliseMapRow } from './map-rows.js';
import { decodeBlock, decodeBlockAsync, fillTexts, type PointBlock } from './point-blocks.js';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Reads stored maps (metadata rows and point rows); sync writes them. */
@Injectable()
export class MapsService {
  constructor(@InjectConnection() private readonly sequelize: Sequelize) {}

  /** The map `mapId` of the project, or 404. */
  async find(projectId: string, mapId: string, transaction?: Transaction): Promise<MapRow> {
    if (!UUID.test(mapId)) throw mapNotFound();
    const rows = await this.sequelize.query<Record<string, unknown>>(`SELECT ${MAP_COLUMNS} FROM maps WHERE project_id = ? AND id = ?`, {
      type: QueryTypes.SELECT,
      replacements: [projectId, mapId.toLowerCase()],
      transaction,
    });
    if (rows.length === 0) throw mapNotFound();
    return normaliseMapRow(rows[0]);
  }

  /** Keys and hashes of every point of a map, block by block (no point texts). */
  async directory(mapPk: number, transaction?: Transaction): Promise<PointBlock[]> {
    const rows = await this.sequelize.query<{ b: number; k: string }>('SELECT block_no AS b, point_keys AS k FROM map_point_blocks WHERE map_pk = ? ORDER BY block_no', {
      type: QueryTypes.SELECT,
      replacements: [mapPk],
      transaction,
    });
    return rows.map((r) => decodeBlock(Number(r.b), r.k));
  }

  /** Blocks of a map with their point texts (all, or those of the given numbers). */
  async blocks(mapPk: number, blockNos?: number[], transaction?: Transaction): Promise<PointBlock[]> {
    if (blockNos !== undefined && blockNos.length === 0) return [];
    const rows = await this.sequelize.query<{ b: number; k: string; d: Buffer }>(
      `SELECT block_no AS b, point_keys AS k, data AS d FROM map_point_blocks WHERE map_pk = ?${blockNos ? ' AND block_no IN (?)' : ''} ORDER BY block_no`,
      { type: QueryTypes.SELECT, replacements: blockNos ? [mapPk, blockNos] : [mapPk], transaction },
    );
    return Promise.all(rows.map((r) => decodeBlockAsync(Number(r.b), r.k, r.d)));
  }

  /**
   * Loads the point texts of blocks read by `directory` (their keys and hashes are not read again),
   * inflating all of them in parallel; returns the same blocks. Only for a caller that holds the
   * map's row lock (a push) since the directory was read: the texts must belong to those keys.
   */
  async withTexts(mapPk: number, blocks: PointBlock[], transaction?: Transaction): Promise<PointBlock[]> {
    if (blocks.length === 0) return blocks;
    const rows = await this.sequelize.query<{ b: number; d: Buffer }>('SELECT block_no AS b, data AS d FROM map_point_blocks WHERE map_pk = ? AND block_no IN (?)', {
      type: QueryTypes.SELECT,
      replacements: [mapPk, blocks.map((b) => b.blockNo)],
      transaction,
    });
    const byNo = new Map(blocks.map((b) => [b.blockNo, b]));
    if (rows.length !== blocks.length) throw new Error(`map ${mapPk}: ${blocks.length} blocks asked for, ${rows.length} read`);
    await Promise.all(rows.map((r) => fillTexts(byNo.get(Number(r.b)) as PointBlock, r.d)));
    return blocks;
  }

  /** Every point key of a map. */
  async keys(mapPk: number, transaction?: Transaction): Promise<string[]> {
    return (await this.directory(mapPk, transaction)).flatMap((b) => b.entries.map((e) => e.key));
  }

  /** Points of a map (all, or those of the given keys that it holds), keyed by point key. */
  async points(mapPk: number, keys?: string[], transaction?: Transaction): Promise<Record<string, MapPoint>> {
    const out: Record<string, MapPoint> = {};
    if (keys === undefined) {
      for (const b of await this.blocks(mapPk, undefined, transaction)) for (const e of b.entries) out[e.key] = JSON.parse(e.text as string) as MapPoint;
      return out;
    }
    const wanted = new Set(keys);
    const nos = (await this.directory(mapPk, transaction)).filter((b) => b.entries.some((e) => wanted.has(e.key))).map((b) => b.blockNo);
    for (const b of await this.blocks(mapPk, nos, transaction)) {
      for (const e of b.entries) if (wanted.has(e.key)) out[e.key] = JSON.parse(e.text as string) as MapPoint;
    }
    return out;
  }

  /** The whole stored map as a phasewright.map/1 document (points sorted by key). */
  async load(projectId: string, mapId: string): Promise<{ row: MapRow; map: PhaseMap }> {
    const row = await this.find(projectId, mapId);
    const points = await this.points(row.pk);
    const sorted: Record<string, MapPoint> = {};
    for (const key of Object.keys(points).sort()) sorted[key] = points[key];
    return { row, map: assembleMap(row, sorted) };
  }

  async list(projectId: string): Promise<MapSummaryDto[]> {
    const rows = await this.sequelize.query<Record<string, unknown>>(`SELECT ${MAP_COLUMNS} FROM maps WHERE project_id = ? ORDER BY created_at, id`, {
      type: QueryTypes.SELECT,
      replacements: [projectId],
    });
    return rows.map((r) => toSummary(normaliseMapRow(r)));
  }

  async summary(projectId: string, mapId: string): Promise<MapSummaryDto> {
    return toSummary(await this.find(projectId, mapId));
  }
}

export function mapNotFound(): NotFoundException {
  return new NotFoundException({ message: 'No such map in this project', details: null });
}

export function toSummary(row: MapRow): MapSummaryDto {
  const sweep = JSON.parse(row.sweep) as { name?: string; axes: unknown[] };
  return {
    id: row.id,
    identity: row.identity,
    method: row.method,
    name: sweep.name ?? null,
    sweep: JSON.parse(row.sweep) as Record<string, unknown>,
    provenance: JSON.parse(row.provenance) as Record<string, unknown>,
    pointCount: row.pointCount,
    pointsDigest: row.pointsDigest,
    seq: row.seq,
    createdBy: row.createdBy,
    updatedBy: row.updatedBy,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
  };
}
