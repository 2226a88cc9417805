// Entry of a sweep worker thread: registers tsx (the CLI runs the TypeScript sources without a
// build step; workers do not inherit the main thread's loader) and loads the worker module.
import { workerData } from 'node:worker_threads';

if (workerData.tsx) {
  const { register } = await import('tsx/esm/api');
  register();
}
await import(workerData.module);
