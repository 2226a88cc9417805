/**
 * The sweep `Executor` on Node worker threads: a pool of N workers, started on first use and
 * kept across `run` calls (coarse pass and refinement rounds) until `close()`. Each worker runs
 * whole segments (so warm starts stay inside one thread); segments go to whichever worker is
 * free. Cancelling terminates the pool (points already streamed back are kept by the engine).
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import type { Executor, PointEvent, SegmentJob } from '../src/sweep/segment.js';
import type { FromWorker, ToWorker } from './sweep-worker.js';

export interface NodeExecutorOptions {
  /** Worker threads. @default availableParallelism() */
  workers?: number;
  /** Module (file URL) exporting the point solver. @default the real solver, src/sweep/solve-point.ts */
  solverModule?: string;
  /** @default 'solvePoint' */
  solverExport?: string;
}

const here = import.meta.url;
const runningTs = here.endsWith('.ts');

export function defaultSolverModule(): string {
  return new URL(`../src/sweep/solve-point.${runningTs ? 'ts' : 'js'}`, here).href;
}

interface Slot {
  worker: Worker;
  ready: boolean;
  busy: boolean;
}

interface Batch {
  queue: { id: number; job: SegmentJob }[];
  running: number;
  onEvent: (event: PointEvent) => void;
  resolve: () => void;
  reject: (error: unknown) => void;
}

export class NodeExecutor implements Executor {
  readonly concurrency: number;
  private readonly solverModule: string;
  private readonly solverExport: string;
  private slots: Slot[] = [];
  private batch: Batch | undefined;

  constructor(options: NodeExecutorOptions = {}) {
    this.concurrency = Math.max(1, options.workers ?? availableParallelism());
    this.solverModule = options.solverModule ?? defaultSolverModule();
    this.solverExport = options.solverExport ?? 'solvePoint';
  }

  private start(): void {
    while (this.slots.length < this.concurrency) {
      const worker = new Worker(new URL('./sweep-worker-entry.mjs', here), {
        workerData: {
          tsx: runningTs,
          module: new URL(`./sweep-worker.${runningTs ? 'ts' : 'js'}`, here).href,
          solverModule: this.solverModule,
          solverExport: this.solverExport,
        },
      });
      const slot: Slot = { worker, ready: false, busy: false };
      this.slots.push(slot);
      worker.on('message', (msg: FromWorker) => this.onMessage(slot, msg));
      worker.on('error', (error) => this.fail(error));
      worker.on('exit', (code) => {
        if (this.slots.includes(slot) && code !== 0) this.fail(new Error(`sweep worker exited with code ${code}`));
      });
    }
  }

  private onMessage(slot: Slot, msg: FromWorker): void {
    const b = this.batch;
    if (msg.type === 'ready') {
      slot.ready = true;
      this.dispatch();
    } else if (msg.type === 'event') {
      b?.onEvent(msg.event);
    } else if (msg.type === 'done') {
      slot.busy = false;
      if (b) b.running--;
      this.dispatch();
    } else {
      this.fail(new Error(`sweep worker failed: ${msg.message}`));
    }
  }

  private dispatch(): void {
    const b = this.batch;
    if (!b) return;
    for (const slot of this.slots) {
      if (!slot.ready || slot.busy) continue;
      const item = b.queue.shift();
      if (!item) break;
      slot.busy = true;
      b.running++;
      slot.worker.postMessage({ type: 'job', id: item.id, job: item.job } satisfies ToWorker);
    }
    if (b.queue.length === 0 && b.running === 0) {
      this.batch = undefined;
      b.resolve();
    }
  }

  private fail(error: unknown): void {
    const b = this.batch;
    this.batch = undefined;
    void this.close();
    b?.reject(error);
  }

  run(jobs: SegmentJob[], onEvent: (event: PointEvent) => void, signal?: AbortSignal): Promise<void> {
    if (this.batch) return Promise.reject(new Error('NodeExecutor.run: a run is already in progress'));
    if (jobs.length === 0) return Promise.resolve();
    signal?.throwIfAborted();
    return new Promise<void>((resolve, reject) => {
      const onAbort = () => this.fail(signal?.reason);
      signal?.addEventListener('abort', onAbort, { once: true });
      this.batch = {
        queue: jobs.map((job, id) => ({ id, job })),
        running: 0,
        onEvent,
        resolve: () => {
          signal?.removeEventListener('abort', onAbort);
          resolve();
        },
        reject: (error) => {
          signal?.removeEventListener('abort', onAbort);
          reject(error);
        },
      };
      this.start();
      this.dispatch();
    });
  }

  /** Terminates the workers (a later `run` starts new ones). */
  async close(): Promise<void> {
    const slots = this.slots;
    this.slots = [];
    await Promise.all(slots.map((s) => s.worker.terminate()));
  }
}
