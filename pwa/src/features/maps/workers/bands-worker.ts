/** The bands worker (module worker, Comlink): the one-particle bands of a point's model, off the main thread. */
import { expose } from 'comlink';
import { computeBands } from '../lib/bands.js';

export const bandsWorkerApi = { computeBands };

export type BandsWorkerApi = typeof bandsWorkerApi;

expose(bandsWorkerApi);
