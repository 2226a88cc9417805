/**
 * Sweep benchmarks (figures, not assertions): points per second for a 1D ED cut (chain L = 16)
 * and a 2D mean-field grid, on one and two worker threads; and the overhead of planning,
 * hashing and merging for a 10,000-point map (target: under 1 s for the three together), and
 * writing, reading and merging (fully overlapping) a 10,000-point map (target: each under 300 ms).
 * Run: npm run bench:sweep
 */
import { availableParallelism } from 'node:os';
import { performance } from 'node:perf_hooks';
import { NodeExecutor } from '../cli/node-executor.js';
import { nodeRuntime } from '../cli/io.js';
import { CORE_VERSION } from '../src/index.js';
import { canonicalJson } from '../src/maps/canonical-json.js';
import { parseMap, parseOwnedMap, type PhaseMap } from '../src/maps/map-format.js';
import { mergeMaps } from '../src/maps/merge.js';
import { mapIdentity } from '../src/maps/provenance.js';
import { chainModel, chainSweep, fakeSolve } from '../src/sweep/fake-solver.js';
import { chunkPlan, planSweep } from '../src/sweep/plan.js';
import { InProcessExecutor, runSweep } from '../src/sweep/run.js';
import type { SweepSpec } from '../src/sweep/spec.js';

const runtime = nodeRuntime();
const line = (label: string, value: string) => console.log(`${label.padEnd(58)} ${value}`);

async function pointsPerSecond(sweep: SweepSpec, workers: number): Promise<{ rate: number; n: number; s: number }> {
  const executor = new NodeExecutor({ workers });
  try {
    // Warm-up: start the workers and load the solver (not timed).
    const one: SweepSpec = { ...sweep, axes: sweep.axes.map((a) => ({ parameter: a.parameter, kind: 'list' as const, values: [1] })) };
    await runSweep(one, { executor, runtime });
    const t0 = performance.now();
    const { map } = await runSweep(sweep, { executor, runtime });
    const s = (performance.now() - t0) / 1000;
    const n = Object.keys(map.points).length;
    return { rate: n / s, n, s };
  } finally {
    await executor.close();
  }
}

console.log(`# sweep benchmarks — Node ${process.version}, ${availableParallelism()} cores, physics-core ${CORE_VERSION}`);

const edCut = chainSweep({ model: chainModel(16), axes: [{ parameter: 'V', kind: 'linear', from: 0, to: 4, points: 24 }] });
const mfGrid: SweepSpec = {
  ...chainSweep({ method: 'meanfield', solver: { supercell: [2], starts: 4 } }),
  model: { ...chainModel(8), parameters: { J: 1, V: 1 } },
  axes: [
    { parameter: 'V', kind: 'linear', from: 0, to: 4, points: 8 },
    { parameter: 'J', kind: 'linear', from: 0.5, to: 1.5, points: 6 },
  ],
};
const only = process.env.BENCH_SWEEP_ONLY; // 'overhead' skips the solver figures
for (const [name, sweep] of only === 'overhead' ? [] : [['ED cut, chain L=16 (dim 12870), with fidelity', edCut], ['mean-field grid 8×6, chain, supercell 2, 4 starts', mfGrid]] as const) {
  for (const workers of [1, 2]) {
    const r = await pointsPerSecond(sweep, workers);
    line(`${name}, ${workers} worker${workers > 1 ? 's' : ''}`, `${r.rate.toFixed(2)} points/s (${r.n} points in ${r.s.toFixed(2)} s)`);
  }
}

// Overhead on a 10,000-point map (100 × 100 grid), with the fake solver building the points.
const big: SweepSpec = {
  ...chainSweep(),
  model: { ...chainModel(8), parameters: { J: 1, V: 1, mu: 0 } },
  axes: [
    { parameter: 'V', kind: 'linear', from: 0, to: 4, points: 100 },
    { parameter: 'mu', kind: 'linear', from: -2, to: 2, points: 100 },
  ],
};
let t = performance.now();
const plan = planSweep(big);
const chunks = [1, 2].map((i) => chunkPlan(plan, { index: i, count: 2 }));
const tPlan = performance.now() - t;
const halves: PhaseMap[] = [];
for (let i = 0; i < 2; i++) halves.push((await runSweep(big, { executor: new InProcessExecutor(fakeSolve), runtime, chunk: { index: i + 1, count: 2 } })).map);
t = performance.now();
const id = mapIdentity(big, CORE_VERSION);
const tHash = performance.now() - t;
t = performance.now();
const text = canonicalJson(halves[0]);
const tText = performance.now() - t;
t = performance.now();
const merged = mergeMaps(halves);
const tMerge = performance.now() - t;
line('10,000-point map: plan (+ 2 chunks)', `${tPlan.toFixed(0)} ms (${plan.items.length} items, ${chunks[0].segments.length + chunks[1].segments.length} segments)`);
line('10,000-point map: identity hash', `${tHash.toFixed(1)} ms (id ${id.slice(0, 12)})`);
line('(writing) canonical JSON of a 5,000-point half', `${tText.toFixed(0)} ms (${(text.length / 1e6).toFixed(1)} MB)`);
line('10,000-point map: merge two halves', `${tMerge.toFixed(0)} ms (${Object.keys(merged.points).length} points)`);
line('10,000-point map: plan + hash + merge (target < 1000 ms)', `${(tPlan + tHash + tMerge).toFixed(0)} ms`);

// Whole-map costs on the 10,000-point map (target: each well under 300 ms).
// Least of three runs, wall and CPU time of this process (on a loaded machine wall time includes waiting).
const best = (f: () => void, runs = 3): string => {
  let wall = Infinity;
  let cpu = Infinity;
  for (let i = 0; i < runs; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    f();
    wall = Math.min(wall, performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu = Math.min(cpu, (c.user + c.system) / 1000);
  }
  return `${wall.toFixed(0)} ms (CPU ${cpu.toFixed(0)} ms)`;
};
let fullText = '';
const tFull = best(() => { fullText = canonicalJson(merged); });
const points = Object.values(merged.points);
const tPerPoint = best(() => { for (const p of points) canonicalJson(p); });
const parsed = JSON.parse(fullText) as unknown;
const tParse = best(() => { parseMap(parsed); });
const owned = [0, 1, 2].map(() => JSON.parse(fullText) as unknown);
const tOwned = best(() => { parseOwnedMap(owned.pop()); });
// A second run of the same sweep: every point again, computed later elsewhere, energies within ED tolerance.
const rerun: PhaseMap = structuredClone(merged);
for (const p of Object.values(rerun.points)) {
  p.energy *= 1 + 1e-12;
  p.wallMs += 1;
  p.computed = { ...p.computed, at: '2031-02-03T04:05:06.000Z', runtime: { kind: 'browser', version: 'bench', cores: 4 } };
}
let overlap: PhaseMap = merged;
const tOverlap = best(() => { overlap = mergeMaps([merged, rerun]); });
const tRemerge = best(() => { mergeMaps([overlap, merged]); });
line('10,000-point map: canonical JSON (target < 300 ms)', `${tFull}, ${(fullText.length / 1e6).toFixed(1)} MB`);
line('10,000-point map: canonical JSON point by point (server)', tPerPoint);
line('10,000-point map: parseMap (target < 300 ms)', tParse);
line('10,000-point map: parseOwnedMap (no copy)', tOwned);
line('10,000-point map: merge with a rerun (target < 300 ms)', `${tOverlap}, ${Object.values(overlap.points).filter((p) => p.history).length} points with history`);
line('10,000-point map: merge the merged map with a source', tRemerge);
