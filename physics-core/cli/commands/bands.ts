/**
 * `phasewright bands MODEL.json [--points n] [--mesh n] [--curvature] [--set g=0.4]`
 *
 * Single-excitation bands of a model: one particle, so conditional hops `when: 'empty'` act as
 * plain hops, `when: 'occupied'` ones and interactions drop out (a warning says so). Prints JSON:
 * the high-symmetry path with its band energies, the Chern numbers of isolated band groups
 * (two-dimensional lattices; Fukui–Hatsugai–Suzuki link variables) and the gaps between bands.
 */
import type { Command } from 'commander';
import { PhasewrightError } from '../../src/errors.js';
import { parseModelSpec } from '../../src/model/validate.js';
import { bandsOfSpec } from '../../src/bands/from-spec.js';
import { inFile, readJsonFile } from '../io.js';
import { parseOverrides } from './solve.js';

export interface BandsCommandOptions {
  points?: string;
  mesh?: string;
  curvature?: boolean;
  set: string[];
  pretty?: boolean;
}

function integer(text: string | undefined, flag: string, min: number, max: number): number | undefined {
  if (text === undefined) return undefined;
  const x = Number(text);
  if (!Number.isInteger(x) || x < min || x > max) {
    throw new PhasewrightError(`${flag} must be an integer from ${min} to ${max} (got "${text}")`, 'usage');
  }
  return x;
}

export function bandsCommand(file: string, opts: BandsCommandOptions): string {
  const spec = inFile(file, () => parseModelSpec(readJsonFile(file)));
  const points = integer(opts.points, '--points', 2, 10_000);
  const mesh = integer(opts.mesh, '--mesh', 3, 400);
  const overrides = parseOverrides(opts.set);
  const report = inFile(file, () =>
    bandsOfSpec(spec, { path: points ? { points } : {}, chern: { ...(mesh ? { mesh } : {}), curvature: opts.curvature ?? false } }, overrides),
  );
  const out = {
    spec: 'phasewright.bands/1',
    model: spec.name ?? null,
    nBands: report.nBands,
    path: {
      labels: report.path.labels,
      k: report.path.k,
      distance: report.path.distance,
    },
    bands: report.path.energies,
    chern: report.chern
      ? { mesh: report.chern.mesh, total: report.chern.total, groups: report.chern.groups }
      : null,
    gaps: report.gaps,
    warnings: report.warnings,
  };
  return JSON.stringify(out, null, opts.pretty ? 2 : undefined);
}

export function registerBands(program: Command): void {
  program
    .command('bands')
    .description('single-excitation bands, Chern numbers and gaps of a model, as JSON')
    .argument('<model>', 'model spec (phasewright.model/1) as a JSON file')
    .option('--points <n>', 'k points along the high-symmetry path (default 121)')
    .option('--mesh <n>', 'k points per axis of the Chern-number mesh (default 24)')
    .option('--curvature', 'include the Berry curvature on the mesh')
    .option('--set <name=value>', 'override a parameter (repeatable)', (v: string, acc: string[]) => [...acc, v], [] as string[])
    .option('--pretty', 'indent the JSON')
    .action((file: string, opts: BandsCommandOptions) => {
      process.stdout.write(`${bandsCommand(file, opts)}\n`);
    });
}
