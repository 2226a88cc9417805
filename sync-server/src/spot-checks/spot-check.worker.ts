/**
 * A spot-check worker thread: runs the segments it was given with physics-core's real point
 * solver (each segment one point, so every re-run starts cold) and posts every point event back.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { type PointEvent, runSegment, type SegmentJob, solvePoint } from '@phasewright/physics-core';

const port = parentPort;
if (!port) throw new Error('spot-check.worker must run in a worker thread');
const jobs = (workerData as { jobs: SegmentJob[] }).jobs;
for (const job of jobs) await runSegment(job, solvePoint, (event: PointEvent) => port.postMessage(event));
port.postMessage({ kind: 'done' });
