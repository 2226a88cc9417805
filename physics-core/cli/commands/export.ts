/** `phasewright export MAP.json --csv [--out FILE]`: one row per point, one column per scalar observable. */
import { writeFileSync } from 'node:fs';
import type { Command } from 'commander';
import { PhasewrightError } from '../../src/errors.js';
import type { PhaseMap } from '../../src/maps/map-format.js';
import { parseMap } from '../../src/maps/map-format.js';
import { inFile, readJsonFile } from '../io.js';

const cell = (v: string | number | boolean | undefined): string => {
  if (v === undefined) return '';
  const s = String(v);
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
};

/** The CSV text of a map: parameters (axis order), level, energy, label, convergence, timing, then scalar observables (sorted). */
export function mapToCsv(map: PhaseMap): string {
  const params = map.sweep.axes.map((a) => a.parameter);
  const points = Object.values(map.points).sort((a, b) => {
    for (const p of params) if (a.parameters[p] !== b.parameters[p]) return a.parameters[p] - b.parameters[p];
    return 0;
  });
  const scalars = [...new Set(points.flatMap((p) => Object.entries(p.observables).filter(([, v]) => typeof v === 'number').map(([k]) => k)))].sort();
  const head = [...params, 'level', 'energy', 'label', 'labelConfidence', 'converged', 'iterations', 'residual', 'wallMs', 'disputed', ...scalars];
  const rows = points.map((p) => [
    ...params.map((k) => p.parameters[k]),
    p.level, p.energy, p.label?.id, p.label?.confidence, p.convergence.converged ? 1 : 0, p.convergence.iterations,
    p.convergence.residual, p.wallMs, p.disputed ? 1 : 0,
    ...scalars.map((k) => p.observables[k] as number | undefined),
  ].map(cell).join(','));
  return `${[head.join(','), ...rows].join('\n')}\n`;
}

export function registerExport(program: Command): void {
  program
    .command('export')
    .description('export a map as CSV (one row per point, one column per scalar observable)')
    .argument('<map>', 'map JSON file')
    .option('--csv', 'CSV output (the only format for now)')
    .option('--out <file>', 'write to a file instead of stdout')
    .action((file: string, opts: { csv?: boolean; out?: string }) => {
      if (!opts.csv) throw new PhasewrightError('choose a format: --csv', 'usage');
      const text = mapToCsv(inFile(file, () => parseMap(readJsonFile(file))));
      if (opts.out) writeFileSync(opts.out, text);
      else process.stdout.write(text);
    });
}
