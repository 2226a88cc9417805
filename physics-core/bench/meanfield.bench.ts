/**
 * Mean-field benchmark: a 50 × 50 grid over two couplings (conditional-hop amplitude g and
 * nearest-neighbour repulsion V) of a zigzag strip at half filling, on a six-site supercell
 * (three unit cells) with eight starts per point, warm-started along each row. Prints points per
 * second on one and on two worker threads. Figures only; nothing is asserted.
 *   npm run bench:mf            (GRID=20 for a quicker run)
 */
import { Worker, isMainThread, parentPort, workerData } from 'node:worker_threads';
import { availableParallelism, loadavg } from 'node:os';
import { solveMeanField, type MeanFieldWarmStart } from '../src/meanfield/gutzwiller.js';
import type { ModelSpec } from '../src/model/types.js';

const GRID = Number(process.env.GRID ?? 50);

const model: ModelSpec = {
  spec: 'phasewright.model/1',
  name: 'zigzag strip with conditional hops (benchmark)',
  lattice: { kind: 'zigzag', size: [12], boundary: ['periodic'] },
  particles: { kind: 'hardcore', filling: 0.5 },
  parameters: { J: 1, g: 0.5, theta: '2*pi/3', V: 1 },
  terms: [
    { kind: 'hop', class: 'zig', amplitude: '-J' },
    { kind: 'conditional-hop', class: 'leg', via: 'common-neighbor', when: 'empty', amplitude: 'g', phase: 'turn*theta' },
    { kind: 'interaction', neighbors: 1, amplitude: 'V' },
  ],
};

function solveRow(row: number): { energies: number[]; lowAgreement: number } {
  const V = (3 * row) / (GRID - 1);
  let warm: MeanFieldWarmStart | undefined;
  const energies: number[] = [];
  let lowAgreement = 0;
  for (let col = 0; col < GRID; col++) {
    const g = (2 * col) / (GRID - 1);
    const { result, warm: next } = solveMeanField(model, { supercell: [3], starts: 8, seed: row * GRID + col, warm }, { g, V });
    warm = next;
    energies.push(result.energyPerSite);
    if ((result.convergence.startsAtMinimum ?? 0) < 2) lowAgreement++;
  }
  return { energies, lowAgreement };
}

async function runOn(workers: number): Promise<{ seconds: number; cpuSeconds: number; lowAgreement: number }> {
  const t0 = performance.now();
  const c0 = process.cpuUsage(); // process-wide: includes the worker threads
  const rows = Array.from({ length: GRID }, (_, r) => r);
  let lowAgreement = 0;
  await Promise.all(
    Array.from({ length: workers }, (_, w) => new Promise<void>((resolve, reject) => {
      const mine = rows.filter((r) => r % workers === w);
      // The CLI's worker entry registers tsx in the thread, then imports this module.
      const worker = new Worker(new URL('../cli/sweep-worker-entry.mjs', import.meta.url), {
        workerData: { rows: mine, tsx: true, module: import.meta.url },
      });
      worker.on('message', (m: { lowAgreement: number }) => {
        lowAgreement += m.lowAgreement;
      });
      worker.on('error', reject);
      worker.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`worker exited with ${code}`))));
    })),
  );
  const c = process.cpuUsage(c0);
  return { seconds: (performance.now() - t0) / 1000, cpuSeconds: (c.user + c.system) / 1e6, lowAgreement };
}

if (isMainThread) {
  const points = GRID * GRID;
  console.log(`mean-field benchmark: ${GRID}×${GRID} grid, zigzag strip, 6-site supercell, 8 starts/point, ${availableParallelism()} CPUs`);
  const [load1] = loadavg();
  console.log(`load average before the run: ${load1.toFixed(2)} (wall figures are only meaningful on an idle machine)`);
  for (const workers of [1, 2]) {
    const { seconds, cpuSeconds, lowAgreement } = await runOn(workers);
    console.log(
      `${workers} worker${workers > 1 ? 's' : ' '}: ${points} points in ${seconds.toFixed(2)} s wall = ${(points / seconds).toFixed(1)} points/s; ` +
        `${cpuSeconds.toFixed(2)} CPU-s = ${(points / cpuSeconds).toFixed(1)} points per CPU-second ` +
        `(points with < 2 starts at the minimum: ${lowAgreement})`,
    );
  }
} else {
  const { rows } = workerData as { rows: number[] };
  let lowAgreement = 0;
  for (const row of rows) lowAgreement += solveRow(row).lowAgreement;
  parentPort?.postMessage({ lowAgreement });
}
