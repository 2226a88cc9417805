/** The browser's sweep worker: a module Worker running sweep-worker.ts, wrapped with Comlink. */
import { proxy, releaseProxy, transfer, wrap } from 'comlink';
import type { SweepWorkerApi } from './sweep-worker.js';
import type { WorkerHandle } from './worker-pool.js';

export function createBrowserWorker(): WorkerHandle {
  const worker = new Worker(new URL('./sweep-worker.ts', import.meta.url), { type: 'module', name: 'phasewright-sweep' });
  const remote = wrap<SweepWorkerApi>(worker);
  return {
    runSegment: (job, onEvent) => remote.runSegment(job, proxy(onEvent)),
    // The start vector is handed over, not copied (it can be tens of megabytes).
    solveDetail: (request, startVector) =>
      startVector ? remote.solveDetail(request, transfer(startVector, [startVector.buffer as ArrayBuffer])) : remote.solveDetail(request),
    terminate: () => {
      remote[releaseProxy]();
      worker.terminate();
    },
  };
}
