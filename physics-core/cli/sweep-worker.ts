/**
 * A sweep worker thread: loads the point solver once, then runs the segments it is sent and
 * streams every point back as soon as it is done. Messages are plain data.
 */
import { parentPort, workerData } from 'node:worker_threads';
import type { PointEvent, PointSolver, SegmentJob } from '../src/sweep/segment.js';
import { runSegment } from '../src/sweep/segment.js';

export type ToWorker = { type: 'job'; id: number; job: SegmentJob };
export type FromWorker =
  | { type: 'ready' }
  | { type: 'event'; event: PointEvent }
  | { type: 'done'; id: number }
  | { type: 'error'; id: number; message: string };

const port = parentPort;
if (!port) throw new Error('sweep-worker.ts must run in a worker thread');
const { solverModule, solverExport } = workerData as { solverModule: string; solverExport: string };
const loaded = (await import(solverModule)) as Record<string, unknown>;
const solve = loaded[solverExport] as PointSolver;
if (typeof solve !== 'function') throw new Error(`${solverModule} has no function export "${solverExport}"`);

const post = (m: FromWorker) => port.postMessage(m);
port.on('message', (msg: ToWorker) => {
  if (msg.type !== 'job') return;
  runSegment(msg.job, solve, (event) => post({ type: 'event', event }))
    .then(() => post({ type: 'done', id: msg.id }))
    .catch((error: unknown) => post({ type: 'error', id: msg.id, message: error instanceof Error ? error.message : String(error) }));
});
post({ type: 'ready' });
