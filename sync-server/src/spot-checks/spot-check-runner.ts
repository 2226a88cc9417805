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

/** What a pooled worker posts: a point event of task `id`, or that task `id` is done. */
export type WorkerReply = { id: number; event: PointEvent } | { id: number; done: true };

interface Pooled {
  worker: Worker;
  idleTimer?: NodeJS.Timeout;
}

/**
 * Worker threads for spot-checks, kept between runs: starting a thread and loading physics-core
 * into it costs seconds (more under tsx), the re-runs themselves often less. A run borrows
 * threads (starting more when none is idle) and gives them back; idle threads are unref'd (they
 * never keep the process alive) and stop after `idleMs`. A thread stopped by a run's time limit
 * or by a crash is not reused. Each point is still solved from a cold start: a job carries one
 * point per segment and no state passes between jobs (physics-core keeps only a cache of lattice
 * structures).
 */
export class SpotCheckPool {
  private readonly idle: Pooled[] = [];
  private readonly all = new Set<Pooled>();
  private nextId = 0;
  private closed = false;

  constructor(private readonly idleMs = 120_000) {}

  /** Threads alive now (busy and idle). */
  get size(): number {
    return this.all.size;
  }

  /**
   * Runs point jobs on `workers` threads (jobs dealt round-robin) and collects every event; stops
   * the run's threads after `timeoutMs` (the points not done by then are reported failed).
   */
  async run(jobs: SegmentJob[], workers: number, timeoutMs: number): Promise<PointEvent[]> {
    if (this.closed) throw new Error('the spot-check pool is closed');
    const n = Math.max(1, Math.min(workers, jobs.length));
    const slices: SegmentJob[][] = Array.from({ length: n }, () => []);
    jobs.forEach((job, i) => slices[i % n].push(job));
    const events: PointEvent[] = [];
    // Threads still on this run's slices (a thread whose slice is done may already serve another run).
    const busy = new Set<Pooled>();
    const finished = slices.map((slice) => {
      const p = this.borrow();
      busy.add(p);
      return this.runSlice(p, slice, events).then(() => void busy.delete(p));
    });
    const timer = setTimeout(() => busy.forEach((p) => void p.worker.terminate()), timeoutMs);
    try {
      await Promise.all(finished);
    } finally {
      clearTimeout(timer);
    }
    return events;
  }

  /** Stops every thread (busy ones too: their runs report the unfinished points failed). */
  async close(): Promise<void> {
    this.closed = true;
    const all = [...this.all];
    this.idle.length = 0;
    await Promise.all(all.map((p) => p.worker.terminate()));
  }

  private borrow(): Pooled {
    const p = this.idle.pop() ?? this.start();
    clearTimeout(p.idleTimer);
    p.worker.ref();
    return p;
  }

  private giveBack(p: Pooled): void {
    if (this.closed || !this.all.has(p)) return;
    p.worker.unref();
    p.idleTimer = setTimeout(() => void p.worker.terminate(), this.idleMs).unref();
    this.idle.push(p);
  }

  private start(): Pooled {
    const worker = new Worker(ENTRY, {
      eval: true,
      workerData: { module: new URL(`./spot-check.worker.${runningTs ? 'ts' : 'js'}`, here).href, tsx: runningTs ? tsxApi() : undefined },
      execArgv: runningTs ? ['--conditions=@phasewright/source'] : [],
    });
    const p: Pooled = { worker };
    this.all.add(p);
    worker.on('exit', () => {
      clearTimeout(p.idleTimer);
      this.all.delete(p);
      const i = this.idle.indexOf(p);
      if (i >= 0) this.idle.splice(i, 1);
    });
    // A crash is reported to the run through its own listeners; an idle thread's crash just ends it.
    worker.on('error', () => {});
    return p;
  }

  private runSlice(p: Pooled, slice: SegmentJob[], events: PointEvent[]): Promise<void> {
    const id = ++this.nextId;
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
    return new Promise<void>((resolve) => {
      const { worker } = p;
      const stop = () => {
        worker.off('message', onMessage);
        worker.off('error', onError);
        worker.off('exit', onExit);
      };
      const onMessage = (msg: WorkerReply) => {
        if (msg.id !== id) return;
        if ('done' in msg) {
          stop();
          this.giveBack(p);
          resolve();
          return;
        }
        done.add(msg.event.key);
        events.push(msg.event);
      };
      const onError = (error: Error) => failRest(`worker failed: ${error.message}`);
      const onExit = () => {
        stop();
        failRest('stopped before this point finished (time limit PW_SPOT_CHECK_TIMEOUT_S)');
        resolve();
      };
      worker.on('message', onMessage);
      worker.on('error', onError);
      worker.on('exit', onExit);
      worker.postMessage({ id, jobs: slice });
    });
  }
}
