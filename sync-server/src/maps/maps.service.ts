import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectConnection } from '@nestjs/sequelize';
import type { MapPoint, PhaseMap } from '@phasewright/physics-core';
import { QueryTypes, type Transaction } from 'sequelize';
import type { Sequelize } from 'sequelize-typescript';
import type { MapSummaryDto } from './dto/map.dto.js';
import { assembleMap, MAP_COLUMNS, type MapRow, normaliseMapRow } from './map-rows.js';

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

  /** Points of a map (all, or those of the given keys), keyed by point key. */
  async points(mapPk: number, keys?: string[], transaction?: Transaction): Promise<Record<string, MapPoint>> {
    return (await this.pointsWithText(mapPk, keys, transaction)).points;
  }

  /** Points and their stored canonical text (sync compares merged results with it). */
  async pointsWithText(mapPk: number, keys?: string[], transaction?: Transaction): Promise<{ points: Record<string, MapPoint>; texts: Map<string, string> }> {
    const out: Record<string, MapPoint> = {};
    const texts = new Map<string, string>();
    const add = (rows: { k: string; d: string }[]) => {
      for (const r of rows) {
        out[r.k] = JSON.parse(r.d) as MapPoint;
        texts.set(r.k, r.d);
      }
    };
    if (keys === undefined) {
      add(await this.sequelize.query<{ k: string; d: string }>('SELECT point_key AS k, data AS d FROM map_points WHERE map_pk = ? ORDER BY point_key', { type: QueryTypes.SELECT, replacements: [mapPk], transaction }));
      return { points: out, texts };
    }
    for (let i = 0; i < keys.length; i += 1000) {
      const chunk = keys.slice(i, i + 1000);
      if (chunk.length === 0) break;
      add(await this.sequelize.query<{ k: string; d: string }>('SELECT point_key AS k, data AS d FROM map_points WHERE map_pk = ? AND point_key IN (?)', { type: QueryTypes.SELECT, replacements: [mapPk, chunk], transaction }));
    }
    return { points: out, texts };
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
