/**
 * `npm run bench:spot-check -w sync-server`: what the spot-check worker pool saves. Runs the same
 * spot-check jobs (4 exact-diagonalisation points of an invented 6-site chain, one cold solve each)
 * five times on 2 threads: with fresh threads per run (start, run, stop: how spot-checks ran before
 * the pool) and with one SpotCheckPool kept across runs. Uses the built server and physics-core
 * (`dist/`), as production does; the script builds them first.
 */
import { type MapPoint, planSweep, spotCheckJobs, type SweepSpec } from '@phasewright/physics-core';
import { CHAIN_6 } from '../test/support/chain-model.js';

const sweep: SweepSpec = {
  spec: 'phasewright.sweep/1',
  name: 'pool bench',
  model: CHAIN_6,
  axes: [{ parameter: 'V', kind: 'linear', from: 0, to: 4, points: 4 }],
  method: 'ed',
  seed: 7,
};
const RUNS = 5;
const THREADS = 2;

async function main(): Promise<void> {
  const { SpotCheckPool } = (await import('../dist/src/spot-checks/spot-check-runner.js')) as typeof import('../src/spot-checks/spot-check-runner.js');
  const items = planSweep(sweep).items;
  const points: Record<string, Pick<MapPoint, 'parameters' | 'level'>> = {};
  for (const i of items) points[i.key] = { parameters: i.parameters, level: 0 };
  const runtime = { kind: 'node' as const, version: process.version, cores: 1 };
  const jobs = () => spotCheckJobs(sweep, points, items.map((i) => i.key), runtime);
  const once = async (pool: InstanceType<typeof SpotCheckPool>) => {
    const t0 = performance.now();
    const events = await pool.run(jobs(), THREADS, 60_000);
    const solved = events.filter((e) => e.kind === 'point').length;
    if (solved !== items.length) throw new Error(`expected ${items.length} points, got ${JSON.stringify(events)}`);
    return (performance.now() - t0) / 1000;
  };
  const fresh: number[] = [];
  for (let r = 0; r < RUNS; r++) {
    const pool = new SpotCheckPool();
    fresh.push(await once(pool));
    await pool.close();
  }
  const pooled: number[] = [];
  const pool = new SpotCheckPool();
  for (let r = 0; r < RUNS; r++) pooled.push(await once(pool));
  await pool.close();
  const fmt = (xs: number[]) => xs.map((x) => x.toFixed(2)).join(' ');
  process.stdout.write(
    `spot-check pool bench (${items.length} ED points per run, ${THREADS} threads, ${RUNS} runs, Node ${process.version}), seconds per run\n` +
      `fresh threads per run:   ${fmt(fresh)}\n` +
      `pool kept across runs:   ${fmt(pooled)}   (the first run starts the threads)\n`,
  );
}

main().catch((error: unknown) => {
  process.stderr.write(`bench:spot-check failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
  process.exit(1);
});
