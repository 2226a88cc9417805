import { Injectable } from '@nestjs/common';
import { CORE_VERSION, exportFileStem, pointsCsv, type PhaseMap } from '@phasewright/physics-core';
import { serverVersion } from '../config/repo-paths.js';
import { MapsService } from '../maps/maps.service.js';
import { methodsSummary } from './methods-summary.js';

@Injectable()
export class ExportsService {
  constructor(private readonly maps: MapsService) {}

  /** The map with its provenance, as one JSON document. */
  async dataPackage(projectId: string, mapId: string): Promise<{ name: string; body: string }> {
    const { row, map } = await this.maps.load(projectId, mapId);
    const pkg = {
      format: 'phasewright.data-package/1',
      exportedAt: new Date().toISOString(),
      exportedBy: { server: serverVersion, physicsCore: CORE_VERSION },
      mapId: row.id,
      pointCount: row.pointCount,
      pointsDigest: row.pointsDigest,
      map,
    };
    return { name: `${fileName(map, row.id)}.json`, body: `${JSON.stringify(pkg, null, 1)}\n` };
  }

  /** One line per point: parameters, energy, label, convergence, provenance, scalar observables. */
  async pointsCsv(projectId: string, mapId: string): Promise<{ name: string; body: string }> {
    const { row, map } = await this.maps.load(projectId, mapId);
    return { name: `${fileName(map, row.id)}-points.csv`, body: pointsCsv(map) };
  }

  async methods(projectId: string, mapId: string): Promise<{ name: string; body: string }> {
    const { row, map } = await this.maps.load(projectId, mapId);
    return { name: `${fileName(map, row.id)}-methods.txt`, body: methodsSummary(map, row.pointsDigest) };
  }
}

function fileName(map: PhaseMap, id: string): string {
  return exportFileStem(map.sweep.name, id);
}
