/**
 * Runs sweeps in this tab: physics-core's sweep engine on a shared worker pool. Points are
 * written to IndexedDB in small batches as they arrive, with the run's state, so a closed tab
 * loses at most the points still being computed; opening the sweep again resumes from the
 * points stored (the engine skips every point the map already has).
 *
 * Pause holds back new segments (the running ones finish and are stored); cancel terminates the
 * workers at once.
 */
import { runSweep, type Progress } from '@phasewright/physics-core';
import { LOCAL_PROJECT_ID, db, pointRow, queueChange, type PointRow, type RunState } from '../../../lib/db.js';
import { loadPhaseMap, provenanceAuthor, runtimeInfo } from '../api/sweeps.js';
import { createBrowserWorker } from '../workers/browser-worker.js';
import { RateMeter, progressFigures, type ProgressFigures } from '../workers/eta.js';
import { WorkerPool } from '../workers/worker-pool.js';

/** Browser sweeps use short segments so that pause and cancel take effect quickly. */
const SEGMENT_LENGTH = 6;
const FLUSH_MS = 250;

export interface LiveRun {
  sweepId: string;
  state: RunState;
  figures: ProgressFigures;
  round: number;
  workers: number;
  error?: string;
}

type Listener = () => void;

interface Active {
  controller: AbortController;
  meter: RateMeter;
  live: LiveRun;
}

let pool: WorkerPool | undefined;
const active = new Map<string, Active>();
const listeners = new Set<Listener>();
const snapshots = new Map<string, LiveRun>();

function emit(run: LiveRun) {
  snapshots.set(run.sweepId, { ...run, figures: { ...run.figures } });
  for (const l of listeners) l();
}

export function subscribe(listener: Listener): () => void {
  listeners.add(listener);
  return () => {
    listeners.delete(listener);
  };
}

export function getLiveRun(sweepId: string): LiveRun | undefined {
  return snapshots.get(sweepId);
}

export function sharedPool(): WorkerPool {
  pool ??= new WorkerPool(createBrowserWorker);
  return pool;
}

export function isActive(sweepId: string): boolean {
  return active.has(sweepId);
}

/** Starts the run of a sweep, continuing from the points already stored. */
export async function startRun(sweepId: string): Promise<void> {
  if (active.has(sweepId)) return;
  const sweep = await db.sweeps.get(sweepId);
  if (!sweep) throw new Error(`no sweep ${sweepId}`);
  const executor = sharedPool();
  const controller = new AbortController();
  const meter = new RateMeter();
  const live: LiveRun = { sweepId, state: 'running', figures: progressFigures(0, 0, 0, 0), round: 0, workers: executor.concurrency };
  active.set(sweepId, { controller, meter, live });
  emit(live);
  executor.resume();
  const resume = await loadPhaseMap(sweep.mapId);
  const now = Date.now();
  const previous = await db.runs.get(sweepId);
  await db.runs.put({ id: sweepId, mapId: sweep.mapId, state: 'running', done: previous?.done ?? 0, total: previous?.total ?? 0, failed: previous?.failed ?? 0, startedAt: previous?.startedAt ?? now, updatedAt: now });

  let pending: PointRow[] = [];
  let lastProgress: Progress | undefined;
  let timer: ReturnType<typeof setTimeout> | undefined;
  let provenance = resume?.provenance;
  const flush = async () => {
    timer = undefined;
    const rows = pending;
    pending = [];
    const p = lastProgress;
    await db.transaction('rw', [db.points, db.maps, db.runs, db.outbox], async () => {
      if (rows.length) await db.points.bulkPut(rows);
      // Points of a server project's map wait in the outbox for the sync engine.
      if (rows.length && sweep.projectId !== LOCAL_PROJECT_ID) await queueChange(db, sweep.projectId, 'map', sweep.mapId);
      const count = await db.points.where('mapId').equals(sweep.mapId).count();
      await db.maps.update(sweep.mapId, { pointCount: count, updatedAt: Date.now(), ...(provenance ? { provenance: structuredClone(provenance) } : {}) });
      if (p) await db.runs.update(sweepId, { done: p.done + p.skipped, total: p.total + p.skipped, failed: p.failed, updatedAt: Date.now() });
    });
  };
  const schedule = () => {
    timer ??= setTimeout(() => void flush(), FLUSH_MS);
  };

  const resumeMap = resume && Object.keys(resume.points).length > 0 ? resume : undefined;
  const author = await provenanceAuthor();
  try {
    const outcome = await runSweep(sweep.spec, {
      executor,
      runtime: runtimeInfo(),
      ...(author !== undefined ? { author } : {}),
      signal: controller.signal,
      segmentLength: SEGMENT_LENGTH,
      ...(resumeMap ? { resume: resumeMap } : {}),
      onPoint: (map, key) => {
        provenance = map.provenance;
        pending.push(pointRow(sweep.mapId, key, map.points[key]));
        schedule();
      },
      onProgress: (p) => {
        lastProgress = p;
        meter.record(p.done, performance.now());
        live.figures = progressFigures(p.done + p.skipped, p.total + p.skipped, p.failed, meter.rate());
        live.round = p.round;
        emit(live);
      },
    });
    if (timer) clearTimeout(timer);
    provenance = outcome.map.provenance;
    await flush();
    if (!outcome.cancelled) {
      // The finished map's points are merged and sorted; store that form.
      await db.transaction('rw', db.points, db.outbox, async () => {
        await db.points.bulkPut(Object.entries(outcome.map.points).map(([k, p]) => pointRow(sweep.mapId, k, p)));
        if (sweep.projectId !== LOCAL_PROJECT_ID) await queueChange(db, sweep.projectId, 'map', sweep.mapId);
      });
    }
    live.state = outcome.cancelled ? 'cancelled' : 'done';
    await db.runs.update(sweepId, { state: live.state, updatedAt: Date.now() });
  } catch (error) {
    if (timer) clearTimeout(timer);
    await flush();
    live.state = 'failed';
    live.error = error instanceof Error ? error.message : String(error);
    await db.runs.update(sweepId, { state: 'failed', error: live.error, updatedAt: Date.now() });
  } finally {
    active.delete(sweepId);
    emit(live);
  }
}

export async function pauseRun(sweepId: string): Promise<void> {
  const a = active.get(sweepId);
  sharedPool().pause();
  if (a) {
    a.live.state = 'paused';
    emit(a.live);
  }
  await db.runs.update(sweepId, { state: 'paused', updatedAt: Date.now() });
}

/** Resume: in this tab, lets the pool hand out segments again; after a reload, starts a run that continues from the stored points. */
export async function resumeRun(sweepId: string): Promise<void> {
  const a = active.get(sweepId);
  if (!a) return startRun(sweepId);
  a.meter.reset();
  a.live.state = 'running';
  emit(a.live);
  sharedPool().resume();
  await db.runs.update(sweepId, { state: 'running', updatedAt: Date.now() });
}

export async function cancelRun(sweepId: string): Promise<void> {
  const a = active.get(sweepId);
  if (a) {
    a.live.state = 'cancelled';
    emit(a.live);
    a.controller.abort(new DOMException('cancelled', 'AbortError'));
  }
  sharedPool().resume();
  await db.runs.update(sweepId, { state: 'cancelled', updatedAt: Date.now() });
}
