import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { PointEvent, SegmentJob } from '@phasewright/physics-core';

const here = import.meta.url;
/** Under Jest (and tsx) the server runs from TypeScript sources; workers need tsx and the source condition then. */
const runningTs = here.endsWith('.ts');

// Worker entry (an eval'd CommonJS script): register tsx when running from sources, then load the worker module.
const ENTRY = `
const { workerData } = require('node:worker_threads');
(async () => {
  if (workerData.tsx) (await import(workerData.tsx)).register();
  await import(workerData.module);
})().catch((error) => { setImmediate(() => { throw error; }); });
`;

/** tsx's ESM API (require.resolve finds its CommonJS twin beside it; the ESM file is the one that registers hooks). */
function tsxApi(): string {
  return pathToFileURL(createRequire(here).resolve('tsx/esm/api').replace(/\.cjs$/, '.mjs')).href;
}

/**
 * Runs point jobs in `workers` fresh worker threads (jobs dealt round-robin) and collects every
 * event; stops all workers after `timeoutMs` (the points not done by then are reported failed).
 */
export async function runInWorkers(jobs: SegmentJob[], workers: number, timeoutMs: number): Promise<PointEvent[]> {
  const n = Math.max(1, Math.min(workers, jobs.length));
  const slices: SegmentJob[][] = Array.from({ length: n }, () => []);
  jobs.forEach((job, i) => slices[i % n].push(job));
  const events: PointEvent[] = [];
  const threads: Worker[] = [];
  const finished = slices.map(
    (slice) =>
      new Promise<void>((resolve) => {
        const worker = new Worker(ENTRY, {
          eval: true,
          workerData: { jobs: slice, module: new URL(`./spot-check.worker.${runningTs ? 'ts' : 'js'}`, here).href, tsx: runningTs ? tsxApi() : undefined },
          execArgv: runningTs ? ['--conditions=@phasewright/source'] : [],
        });
        threads.push(worker);
        const done = new Set<string>();
        const failRest = (why: string) => {
          for (const job of slice) {
            for (const item of job.items) {
              if (done.has(item.key)) continue;
              done.add(item.key);
              events.push({ kind: 'failed', key: item.key, message: why });
            }
          }
        };
        worker.on('message', (msg: PointEvent | { kind: 'done' }) => {
          if (msg.kind === 'done') {
            void worker.terminate();
            return;
          }
          done.add(msg.key);
          events.push(msg);
        });
        worker.on('error', (error) => failRest(`worker failed: ${error.message}`));
        worker.on('exit', () => {
          failRest('stopped before this point finished (time limit PW_SPOT_CHECK_TIMEOUT_S)');
          resolve();
        });
      }),
  );
  const timer = setTimeout(() => threads.forEach((t) => void t.terminate()), timeoutMs);
  try {
    await Promise.all(finished);
  } finally {
    clearTimeout(timer);
  }
  return events;
}
