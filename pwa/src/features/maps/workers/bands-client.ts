/**
 * The page's side of the bands worker: one worker, started the first time a point's bands are
 * asked for and kept for the next points (compiling is the costly part, not starting).
 */
import type { ModelSpec } from '@phasewright/physics-core';
import { wrap, type Remote } from 'comlink';
import type { BandsView } from '../lib/bands.js';
import type { BandsWorkerApi } from './bands-worker.js';

export type BandsComputer = (model: ModelSpec, parameters: Record<string, number>) => Promise<BandsView>;

let remote: Remote<BandsWorkerApi> | null = null;

export const bandsInWorker: BandsComputer = (model, parameters) => {
  remote ??= wrap<BandsWorkerApi>(new Worker(new URL('./bands-worker.ts', import.meta.url), { type: 'module', name: 'phasewright-bands' }));
  return remote.computeBands(model, parameters);
};
