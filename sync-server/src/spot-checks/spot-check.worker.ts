/**
 * A spot-check worker thread, kept by SpotCheckPool between runs: for each task it receives
 * ({id, jobs}) it runs the segments with physics-core's real point solver (each segment one point,
 * so every re-run starts cold), posts every point event back, then that the task is done.
 */
import { parentPort } from 'node:worker_threads';
import { type PointEvent, runSegment, type SegmentJob, solvePoint } from '@phasewright/physics-core';
import type { WorkerReply } from './spot-check-runner.js';

const port = parentPort;
if (!port) throw new Error('spot-check.worker must run in a worker thread');
let queue = Promise.resolve();
port.on('message', ({ id, jobs }: { id: number; jobs: SegmentJob[] }) => {
  // One task at a time, in the order received.
  queue = queue.then(async () => {
    for (const job of jobs) await runSegment(job, solvePoint, (event: PointEvent) => port.postMessage({ id, event } satisfies WorkerReply));
    port.postMessage({ id, done: true } satisfies WorkerReply);
  });
});
