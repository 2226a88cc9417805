/**
 * `phasewright sweep SWEEP.json --out MAP.json [--workers N] [--chunk i/n] [--resume]`
 *
 * Runs a sweep on worker threads with a progress line on stderr, writing the map atomically
 * every few seconds so that a killed run continues with `--resume` without losing or repeating
 * a point. `--chunk i/n` runs the i-th of n contiguous pieces of the coarse plan (for a
 * scheduler's job array); merge the chunk maps with `phasewright merge`, then run
 * `sweep --resume` on the merged map to refine it (refinement needs the whole map).
 */
import { existsSync } from 'node:fs';
import type { Command } from 'commander';
import { PhasewrightError } from '../../src/errors.js';
import { parseMap, serializeMap } from '../../src/maps/map-format.js';
import type { PhaseMap } from '../../src/maps/map-format.js';
import { parseChunk } from '../../src/sweep/plan.js';
import { runSweep } from '../../src/sweep/run.js';
import { parseSweepSpec } from '../../src/sweep/spec.js';
import { inFile, nodeRuntime, readJsonFile, writeFileAtomic } from '../io.js';
import { NodeExecutor } from '../node-executor.js';
import { progressReporter } from '../progress.js';

export interface SweepCommandOptions {
  out: string;
  workers?: string;
  chunk?: string;
  resume?: boolean;
  refine: boolean;
  saveEvery: string;
  author?: string;
}

const positiveInt = (text: string, flag: string): number => {
  const n = Number(text);
  if (!Number.isInteger(n) || n < 1) throw new PhasewrightError(`${flag} must be a positive integer (got "${text}")`, 'usage');
  return n;
};

/** `PHASEWRIGHT_POINT_SOLVER=<module URL>#<export>` swaps the point solver (used to test the machinery with a fake). */
export function solverOverride(): { solverModule?: string; solverExport?: string } {
  const spec = process.env.PHASEWRIGHT_POINT_SOLVER;
  if (!spec) return {};
  const [solverModule, solverExport] = spec.split('#');
  return { solverModule, solverExport: solverExport || 'solvePoint' };
}

export async function sweepCommand(file: string, opts: SweepCommandOptions): Promise<void> {
  const sweep = inFile(file, () => parseSweepSpec(readJsonFile(file)));
  const chunk = opts.chunk !== undefined ? parseChunk(opts.chunk) : undefined;
  const workers = opts.workers !== undefined ? positiveInt(opts.workers, '--workers') : undefined;
  const saveEveryMs = Number(opts.saveEvery) * 1000;
  if (!(saveEveryMs >= 0)) throw new PhasewrightError(`--save-every must be a number of seconds ≥ 0 (got "${opts.saveEvery}")`, 'usage');
  let resume: PhaseMap | undefined;
  if (existsSync(opts.out)) {
    if (!opts.resume) throw new PhasewrightError(`${opts.out} exists; pass --resume to continue it, or choose another --out`, 'usage');
    resume = inFile(opts.out, () => parseMap(readJsonFile(opts.out)));
  }
  const executor = new NodeExecutor({ ...(workers ? { workers } : {}), ...solverOverride() });
  const controller = new AbortController();
  const stop = () => controller.abort(new PhasewrightError('interrupted', 'interrupted'));
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
  const progress = progressReporter();
  let lastSave = Date.now();
  try {
    const outcome = await runSweep(sweep, {
      executor,
      runtime: nodeRuntime(),
      ...(opts.author !== undefined ? { author: opts.author } : {}),
      ...(chunk ? { chunk } : {}),
      ...(resume ? { resume } : {}),
      refine: opts.refine && !chunk,
      signal: controller.signal,
      onProgress: progress.onProgress,
      onPoint: (map) => {
        if (Date.now() - lastSave >= saveEveryMs) {
          writeFileAtomic(opts.out, serializeMap(map));
          lastSave = Date.now();
        }
      },
    });
    progress.done();
    writeFileAtomic(opts.out, serializeMap(outcome.map));
    const total = Object.keys(outcome.map.points).length;
    if (outcome.cancelled) {
      throw new PhasewrightError(`interrupted: ${total} points saved in ${opts.out}; run again with --resume to continue`, 'interrupted');
    }
    process.stderr.write(
      `${outcome.computed} points computed, ${outcome.skipped} resumed, ${outcome.failed} failed; ${total} points in ${opts.out} (map ${outcome.map.id.slice(0, 12)})\n`,
    );
    if (chunk && (sweep.refine?.maxDepth ?? 0) > 0) {
      process.stderr.write('refinement skipped in a chunk: merge the chunks, then run `sweep --resume` on the merged map to refine it\n');
    }
    if (outcome.failed > 0) throw new PhasewrightError(`${outcome.failed} points failed (see the map's provenance warnings)`, 'failed');
  } finally {
    await executor.close();
    process.off('SIGINT', stop);
    process.off('SIGTERM', stop);
  }
}

export function registerSweep(program: Command): void {
  program
    .command('sweep')
    .description('run a sweep (phasewright.sweep/1) into a map (phasewright.map/1)')
    .argument('<sweep>', 'sweep spec JSON file')
    .requiredOption('--out <map>', 'map file to write (atomically, every --save-every seconds and at the end)')
    .option('--workers <n>', 'worker threads (default: all cores)')
    .option('--chunk <i/n>', 'run only the i-th of n contiguous chunks of the plan (1-based)')
    .option('--resume', 'continue the map in --out: skip points it already holds')
    .option('--no-refine', 'skip the refinement rounds')
    .option('--save-every <seconds>', 'checkpoint interval', '5')
    .option('--author <name>', 'author recorded in the provenance')
    .action((file: string, opts: SweepCommandOptions) => sweepCommand(file, opts));
}
