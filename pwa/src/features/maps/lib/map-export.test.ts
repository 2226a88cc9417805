import { InProcessExecutor, parseMap, runSweep, solvePoint, type SweepSpec } from '@phasewright/physics-core';
import { describe, expect, it } from 'vitest';
import { chainVCut } from '../../../test/chain-sweep.js';
import type { MapRecord } from '../../../lib/db.js';
import { localDataPackage, pointsCsv } from './map-export.js';

const runtime = { kind: 'browser' as const, version: 'vitest, "quoted", engine', cores: 1 };
const sweep: SweepSpec = chainVCut({ name: 'Chain, V cut', sites: 4, to: 2, points: 3, seed: 1 });

/** RFC 4180 reader for the test (quoted fields, doubled quotes). */
function readCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        field += '"';
        i++;
      } else if (c === '"') quoted = false;
      else field += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') {
      row.push(field);
      field = '';
    } else if (c === '\r' && text[i + 1] === '\n') {
      row.push(field);
      rows.push(row);
      row = [];
      field = '';
      i++;
    } else field += c;
  }
  return rows;
}

describe('local map exports', async () => {
  const { map } = await runSweep(sweep, { executor: new InProcessExecutor(solvePoint), runtime, refine: false });
  const record = { id: '0f1e2d3c-0000-4000-8000-000000000000', name: 'x', identity: map.id, sweep, provenance: map.provenance, method: 'ed', lattice: 'chain', pointCount: 3, sweepId: 's' } as unknown as MapRecord;

  it('CSV: one line per point, energies round-trip exactly, quoted fields survive', () => {
    const rows = readCsv(pointsCsv(record, map.points));
    expect(rows).toHaveLength(1 + Object.keys(map.points).length);
    const [header, ...body] = rows;
    const e = header.indexOf('energy');
    const runtimeCol = header.indexOf('runtime');
    for (const r of body) {
      expect(Number(r[e])).toBe(map.points[r[0]].energy);
      expect(r[runtimeCol]).toBe(`browser ${runtime.version}`);
      expect(r).toHaveLength(header.length);
    }
    // 2 hardcore bosons on an open 4-site chain at V=0 are free fermions (Jordan–Wigner; Lieb,
    // Schultz & Mattis, Ann. Phys. 16, 407 (1961)): E0 = −2(cos(π/5) + cos(2π/5)) = −√5.
    const v0 = body.find((r) => Number(r[header.indexOf('V')]) === 0);
    expect(Number(v0?.[e])).toBeCloseTo(-Math.sqrt(5), 9);
  });

  it('the data package holds a map document that physics-core reads back unchanged', () => {
    const pkg = JSON.parse(localDataPackage(record, map.points)) as { map: unknown; pointCount: number };
    expect(pkg.pointCount).toBe(3);
    const back = parseMap(pkg.map);
    expect(back.id).toBe(map.id);
    expect(back.points).toEqual(map.points);
  });
});
