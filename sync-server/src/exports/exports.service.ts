import { Injectable } from '@nestjs/common';
import { CORE_VERSION, type PhaseMap } from '@phasewright/physics-core';
import { serverVersion } from '../config/repo-paths.js';
import { MapsService } from '../maps/maps.service.js';
import { methodsSummary } from './methods-summary.js';

/** CSV field: quoted when it holds a comma, quote or line break (RFC 4180). */
const csvField = (v: unknown): string => {
  const s = v === undefined || v === null ? '' : String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
};

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
    const params = map.sweep.axes.map((a) => a.parameter);
    const points = Object.entries(map.points);
    const scalars = [...new Set(points.flatMap(([, p]) => Object.entries(p.observables).filter(([, v]) => typeof v === 'number').map(([k]) => k)))].sort();
    const header = ['key', ...params, 'energy', 'label', 'label_confidence', 'converged', 'iterations', 'residual', 'level', 'seed', 'wall_ms', 'computed_at', 'computed_by', 'runtime', 'disputed_results', 'other_results', ...scalars];
    const lines = [header.map(csvField).join(',')];
    for (const [key, p] of points) {
      lines.push(
        [
          key,
          ...params.map((n) => p.parameters[n]),
          p.energy,
          p.label?.id,
          p.label?.confidence,
          p.convergence.converged,
          p.convergence.iterations,
          p.convergence.residual,
          p.level,
          p.seed,
          p.wallMs,
          p.computed.at,
          p.computed.author,
          `${p.computed.runtime.kind} ${p.computed.runtime.version}`,
          p.disputed?.length ?? 0,
          p.history?.length ?? 0,
          ...scalars.map((s) => p.observables[s]),
        ]
          .map(csvField)
          .join(','),
      );
    }
    return { name: `${fileName(map, row.id)}-points.csv`, body: `${lines.join('\r\n')}\r\n` };
  }

  async methods(projectId: string, mapId: string): Promise<{ name: string; body: string }> {
    const { row, map } = await this.maps.load(projectId, mapId);
    return { name: `${fileName(map, row.id)}-methods.txt`, body: methodsSummary(map, row.pointsDigest) };
  }
}

function fileName(map: PhaseMap, id: string): string {
  const base = (map.sweep.name ?? 'map').toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60);
  return `${base || 'map'}-${id.slice(0, 8)}`;
}
