/**
 * `phasewright spot-check MAP.json --sample K [--seed s]`: re-runs K points of a map, sampled
 * reproducibly from the seed, each from a cold start, and compares energies and labels with the
 * stored ones. Prints the largest energy difference, the label agreement and one PASS/FAIL line;
 * exits 1 on FAIL.
 */
import type { Command } from 'commander';
import { PhasewrightError } from '../../src/errors.js';
import { CORE_VERSION } from '../../src/version.js';
import { compareSpotCheck, samplePointKeys, SPOT_CHECK_TOLERANCE, spotCheckJobs, type SpotCheckComparison } from '../../src/maps/spot-check.js';
import type { MapPoint, PhaseMap } from '../../src/maps/map-format.js';
import { parseMap } from '../../src/maps/map-format.js';
import { inFile, nodeRuntime, readJsonFile } from '../io.js';
import { NodeExecutor } from '../node-executor.js';
import { solverOverride } from './sweep.js';

/** Re-runs `keys` of the map, each from a cold start, and judges them with physics-core's rule. */
export async function spotCheck(map: PhaseMap, keys: string[], tolerance: number, workers?: number): Promise<SpotCheckComparison> {
  const jobs = spotCheckJobs(map.sweep, map.points, keys, nodeRuntime());
  const fresh = new Map<string, MapPoint>();
  const failures = new Map<string, string>();
  const executor = new NodeExecutor({ ...(workers ? { workers } : {}), ...solverOverride() });
  try {
    await executor.run(jobs, (e) => {
      if (e.kind === 'point') fresh.set(e.key, e.point);
      else failures.set(e.key, e.message);
    });
  } finally {
    await executor.close();
  }
  const stored: Record<string, MapPoint> = {};
  for (const k of keys) stored[k] = map.points[k];
  return compareSpotCheck(map.sweep.method, stored, fresh, failures, tolerance);
}

export function registerSpotCheck(program: Command): void {
  program
    .command('spot-check')
    .description('re-run sampled points of a map and check that they reproduce')
    .argument('<map>', 'map JSON file')
    .requiredOption('--sample <k>', 'number of points to re-run')
    .option('--seed <s>', 'seed of the sample', '1')
    .option('--tolerance <relative>', `energy tolerance on |ΔE|/max(|E|,1) (default: ${SPOT_CHECK_TOLERANCE.ed} for ED, ${SPOT_CHECK_TOLERANCE.meanfield} for mean-field)`)
    .option('--workers <n>', 'worker threads (default: all cores)')
    .action(async (file: string, opts: { sample: string; seed: string; tolerance?: string; workers?: string }) => {
      const k = Number(opts.sample);
      const seed = Number(opts.seed);
      if (!Number.isInteger(k) || k < 1) throw new PhasewrightError(`--sample must be a positive integer (got "${opts.sample}")`, 'usage');
      if (!Number.isInteger(seed) || seed < 0) throw new PhasewrightError(`--seed must be an integer ≥ 0 (got "${opts.seed}")`, 'usage');
      const map = inFile(file, () => parseMap(readJsonFile(file)));
      const tolerance = opts.tolerance !== undefined ? Number(opts.tolerance) : SPOT_CHECK_TOLERANCE[map.sweep.method];
      if (!(tolerance > 0)) throw new PhasewrightError(`--tolerance must be a positive number (got "${opts.tolerance}")`, 'usage');
      const workers = opts.workers !== undefined ? Number(opts.workers) : undefined;
      if (map.provenance.coreVersion !== CORE_VERSION) {
        process.stderr.write(`note: the map was computed by physics-core ${map.provenance.coreVersion}; this is ${CORE_VERSION}\n`);
      }
      const keys = samplePointKeys(Object.keys(map.points), k, seed);
      const r = await spotCheck(map, keys, tolerance, workers);
      const out = process.stdout;
      out.write(`spot-check ${file}: ${keys.length} of ${Object.keys(map.points).length} points re-run from cold starts (seed ${seed})\n`);
      out.write(`max |ΔE| = ${r.maxAbsEnergyDifference.toExponential(2)} (relative ${r.maxRelEnergyDifference.toExponential(2)}${r.worstKey ? ` at ${r.worstKey}` : ''})\n`);
      out.write(`labels agree: ${r.labelsAgree}/${r.labelsCompared}\n`);
      for (const p of r.points) {
        if (p.problem) out.write(`${p.outcome === 'not-run' ? 'failed' : 'differs'}: ${p.key}: ${p.problem}\n`);
        else if (p.note) out.write(`note: ${p.key}: ${p.note}\n`);
      }
      const verdict = `${r.reproduced} reproduced within ${tolerance}${r.storedLower ? `, ${r.storedLower} stored lower` : ''}${r.differs ? `, ${r.differs} differ` : ''}${r.failed ? `, ${r.failed} failed` : ''}; ${r.labelsAgree}/${r.labelsCompared} labels agree`;
      if (!r.pass) throw new PhasewrightError(`FAIL: ${verdict}`, 'spot-check');
      out.write(`PASS: ${verdict}\n`);
    });
}
