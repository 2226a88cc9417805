/**
 * A pool of sweep web workers that implements physics-core's sweep `Executor`: the engine hands
 * it path segments, the pool gives each to a free worker (a whole segment to one worker, so
 * warm starts stay inside it) and streams points back as they finish.
 *
 * - Size: `navigator.hardwareConcurrency − 1`, at least 1 (one core stays with the page).
 * - Pause: no new segment starts; segments already running finish. Resume starts them again.
 * - Cancel (the engine's AbortSignal): every worker is terminated at once (a Lanczos run cannot
 *   be interrupted from outside); points already delivered stay delivered, and new workers are
 *   started on the next run.
 */
import type { Executor, PointEvent, PointRequest, SegmentJob } from '@phasewright/physics-core';
import type { DetailAnswer } from './sweep-worker.js';

/** What the pool needs of one worker; the browser one wraps a module Worker with Comlink. */
export interface WorkerHandle {
  runSegment(job: SegmentJob, onEvent: (event: PointEvent) => void): Promise<void>;
  solveDetail(request: PointRequest, startVector?: Float64Array): Promise<DetailAnswer>;
  terminate(): void;
}

export type WorkerFactory = () => WorkerHandle;

/** Workers to start: hardware concurrency − 1, at least 1. */
export function defaultPoolSize(hardwareConcurrency: number | undefined = globalThis.navigator?.hardwareConcurrency): number {
  return Math.max(1, Math.floor(hardwareConcurrency ?? 2) - 1);
}

export class WorkerPool implements Executor {
  readonly concurrency: number;
  private slots: (WorkerHandle | undefined)[];
  private detail: WorkerHandle | undefined;
  private paused = false;
  private wakeUp: (() => void)[] = [];
  private running = false;

  constructor(
    private readonly factory: WorkerFactory,
    size: number = defaultPoolSize(),
  ) {
    this.concurrency = Math.max(1, Math.floor(size));
    this.slots = new Array<WorkerHandle | undefined>(this.concurrency).fill(undefined);
  }

  get isPaused(): boolean {
    return this.paused;
  }

  /** Workers currently alive (started lazily, dropped on cancel). */
  get liveWorkers(): number {
    return this.slots.filter(Boolean).length;
  }

  pause(): void {
    this.paused = true;
  }

  resume(): void {
    this.paused = false;
    for (const wake of this.wakeUp.splice(0)) wake();
  }

  private slot(i: number): WorkerHandle {
    let handle = this.slots[i];
    if (!handle) {
      handle = this.factory();
      this.slots[i] = handle;
    }
    return handle;
  }

  private waitWhilePaused(signal?: AbortSignal): Promise<void> {
    if (!this.paused) return Promise.resolve();
    return new Promise<void>((resolve, reject) => {
      const onAbort = () => reject(signal?.reason);
      signal?.addEventListener('abort', onAbort, { once: true });
      this.wakeUp.push(() => {
        signal?.removeEventListener('abort', onAbort);
        resolve();
      });
    });
  }

  run(jobs: SegmentJob[], onEvent: (event: PointEvent) => void, signal?: AbortSignal): Promise<void> {
    if (this.running) return Promise.reject(new Error('WorkerPool.run: a run is already in progress'));
    if (signal?.aborted) return Promise.reject(signal.reason);
    if (jobs.length === 0) return Promise.resolve();
    this.running = true;
    const queue = [...jobs];
    let aborted = false;
    const deliver = (event: PointEvent) => {
      if (!aborted) onEvent(event);
    };
    const lane = async (i: number) => {
      for (;;) {
        await this.waitWhilePaused(signal);
        if (aborted) return;
        const job = queue.shift();
        if (!job) return;
        await this.slot(i).runSegment(job, deliver);
      }
    };
    const lanes = Promise.all(Array.from({ length: Math.min(this.concurrency, jobs.length) }, (_, i) => lane(i)));
    return new Promise<void>((resolve, reject) => {
      const finish = (error?: unknown) => {
        signal?.removeEventListener('abort', onAbort);
        this.running = false;
        if (error === undefined) resolve();
        else reject(error);
      };
      const onAbort = () => {
        aborted = true;
        this.terminateAll();
        finish(signal?.reason ?? new DOMException('cancelled', 'AbortError'));
      };
      signal?.addEventListener('abort', onAbort, { once: true });
      lanes.then(
        () => {
          if (!aborted) finish();
        },
        (error: unknown) => {
          if (aborted) return;
          aborted = true;
          this.terminateAll();
          finish(error);
        },
      );
    });
  }

  /** Solves one point in full for the detail view, on a worker of its own (not a sweep lane). */
  solveDetail(request: PointRequest, startVector?: Float64Array): Promise<DetailAnswer> {
    this.detail ??= this.factory();
    return this.detail.solveDetail(request, startVector);
  }

  private terminateAll(): void {
    for (const [i, handle] of this.slots.entries()) {
      handle?.terminate();
      this.slots[i] = undefined;
    }
  }

  async close(): Promise<void> {
    this.terminateAll();
    this.detail?.terminate();
    this.detail = undefined;
  }
}
