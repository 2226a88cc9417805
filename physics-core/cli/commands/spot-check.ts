/**
 * `phasewright spot-check MAP.json --sample K [--seed s]`: re-runs K points of a map, sampled
 * reproducibly from the seed, each from a cold start, and compares energies and labels with the
 * stored ones. Prints the largest energy difference, the label agreement and one PASS/FAIL line;
 * exits 1 on FAIL.
 */
import type { Command } from 'commander';
import { PhasewrightError } from '../../src/errors.js';
import { CORE_VERSION } from '../../src/version.js';
import { samplePointKeys, spotCheckJobs } from '../../src/maps/spot-check.js';
import type { MapPoint, PhaseMap } from '../../src/maps/map-format.js';
import { parseMap } from '../../src/maps/map-format.js';
import { inFile, nodeRuntime, readJsonFile } from '../io.js';
import { NodeExecutor } from '../node-executor.js';
import { solverOverride } from './sweep.js';

export interface SpotCheckReport {
  sampled: string[];
  maxAbsEnergyDifference: number;
  maxRelEnergyDifference: number;
  worstKey?: string;
  labelsAgree: number;
  labelsCompared: number;
  failed: string[];
  pass: boolean;
  tolerance: number;
}

/** K keys of the map, drawn without replacement by a seeded shuffle of the sorted keys. */
export function samplePoints(map: PhaseMap, k: number, seed: number): string[] {
  return samplePointKeys(Object.keys(map.points), k, seed);
}

export async function spotCheck(map: PhaseMap, keys: string[], tolerance: number, workers?: number): Promise<SpotCheckReport> {
  const jobs = spotCheckJobs(map.sweep, map.points, keys, nodeRuntime());
  const fresh = new Map<string, MapPoint>();
  const failed: string[] = [];
  const executor = new NodeExecutor({ ...(workers ? { workers } : {}), ...solverOverride() });
  try {
    await executor.run(jobs, (e) => {
      if (e.kind === 'point') fresh.set(e.key, e.point);
      else failed.push(`${e.key}: ${e.message}`);
    });
  } finally {
    await executor.close();
  }
  let maxAbs = 0;
  let maxRel = 0;
  let worstKey: string | undefined;
  let agree = 0;
  let compared = 0;
  for (const [key, p] of fresh) {
    const old = map.points[key];
    const d = Math.abs(p.energy - old.energy);
    const rel = d / Math.max(Math.abs(old.energy), 1e-300);
    if (rel > maxRel || worstKey === undefined) {
      maxRel = Math.max(rel, maxRel);
      worstKey = key;
    }
    maxAbs = Math.max(maxAbs, d);
    if (p.label && old.label) {
      compared++;
      if (p.label.id === old.label.id) agree++;
    }
  }
  const pass = failed.length === 0 && maxRel <= tolerance && agree === compared;
  return { sampled: keys, maxAbsEnergyDifference: maxAbs, maxRelEnergyDifference: maxRel, ...(worstKey ? { worstKey } : {}), labelsAgree: agree, labelsCompared: compared, failed, pass, tolerance };
}

export function registerSpotCheck(program: Command): void {
  program
    .command('spot-check')
    .description('re-run sampled points of a map and check that they reproduce')
    .argument('<map>', 'map JSON file')
    .requiredOption('--sample <k>', 'number of points to re-run')
    .option('--seed <s>', 'seed of the sample', '1')
    .option('--tolerance <relative>', 'relative energy tolerance (default: 1e-8 for ED, 1e-6 for mean-field)')
    .option('--workers <n>', 'worker threads (default: all cores)')
    .action(async (file: string, opts: { sample: string; seed: string; tolerance?: string; workers?: string }) => {
      const k = Number(opts.sample);
      const seed = Number(opts.seed);
      if (!Number.isInteger(k) || k < 1) throw new PhasewrightError(`--sample must be a positive integer (got "${opts.sample}")`, 'usage');
      if (!Number.isInteger(seed) || seed < 0) throw new PhasewrightError(`--seed must be an integer ≥ 0 (got "${opts.seed}")`, 'usage');
      const map = inFile(file, () => parseMap(readJsonFile(file)));
      const tolerance = opts.tolerance !== undefined ? Number(opts.tolerance) : map.sweep.method === 'ed' ? 1e-8 : 1e-6;
      if (!(tolerance > 0)) throw new PhasewrightError(`--tolerance must be a positive number (got "${opts.tolerance}")`, 'usage');
      const workers = opts.workers !== undefined ? Number(opts.workers) : undefined;
      if (map.provenance.coreVersion !== CORE_VERSION) {
        process.stderr.write(`note: the map was computed by physics-core ${map.provenance.coreVersion}; this is ${CORE_VERSION}\n`);
      }
      const keys = samplePoints(map, k, seed);
      const r = await spotCheck(map, keys, tolerance, workers);
      const out = process.stdout;
      out.write(`spot-check ${file}: ${keys.length} of ${Object.keys(map.points).length} points re-run from cold starts (seed ${seed})\n`);
      out.write(`max |ΔE| = ${r.maxAbsEnergyDifference.toExponential(2)} (relative ${r.maxRelEnergyDifference.toExponential(2)}${r.worstKey ? ` at ${r.worstKey}` : ''})\n`);
      out.write(`labels agree: ${r.labelsAgree}/${r.labelsCompared}\n`);
      for (const f of r.failed) out.write(`failed: ${f}\n`);
      const verdict = `energies ${r.maxRelEnergyDifference <= tolerance ? 'within' : 'beyond'} ${tolerance} relative, ${r.labelsAgree}/${r.labelsCompared} labels agree${r.failed.length ? `, ${r.failed.length} failed` : ''}`;
      if (!r.pass) throw new PhasewrightError(`FAIL: ${verdict}`, 'spot-check');
      out.write(`PASS: ${verdict}\n`);
    });
}
