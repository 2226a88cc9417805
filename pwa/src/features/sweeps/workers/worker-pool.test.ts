import {
  InProcessExecutor,
  runSegment,
  runSweep,
  solvePoint,
  type PointRequest,
  type SweepSpec,
} from '@phasewright/physics-core';
import { describe, expect, it } from 'vitest';
import { chainVCut } from '../../../test/chain-sweep.js';
import { WorkerPool, defaultPoolSize, type WorkerHandle } from './worker-pool.js';

const runtime = { kind: 'browser' as const, version: 'vitest', cores: 4 };

const sweep: SweepSpec = chainVCut({ name: 'chain V cut', sites: 6, to: 3, points: 7, seed: 3 });

/** An in-thread stand-in for a worker: asynchronous like one, and `terminate` stops it mid-segment. */
function fakeWorkerFactory(log: { started: number; terminated: number; segments: number }) {
  return (): WorkerHandle => {
    log.started++;
    const stop = new AbortController();
    return {
      async runSegment(job, onEvent) {
        log.segments++;
        await new Promise((r) => setTimeout(r, 1));
        await runSegment(job, async (req, warm) => {
          await new Promise((r) => setTimeout(r, 1));
          return solvePoint(req, warm);
        }, onEvent, stop.signal);
      },
      async solveDetail(request: PointRequest) {
        return { result: solvePoint(request, undefined).result };
      },
      terminate() {
        log.terminated++;
        stop.abort(new Error('terminated'));
      },
    };
  };
}

describe('WorkerPool (sweep Executor)', () => {
  it('sizes itself to hardware concurrency − 1, at least 1', () => {
    expect(defaultPoolSize(8)).toBe(7);
    expect(defaultPoolSize(1)).toBe(1);
    expect(defaultPoolSize(undefined)).toBe(1);
  });

  it('gives the same map as the in-process executor, using at most `concurrency` workers', async () => {
    const log = { started: 0, terminated: 0, segments: 0 };
    const pool = new WorkerPool(fakeWorkerFactory(log), 3);
    const pooled = await runSweep(sweep, { executor: pool, runtime, segmentLength: 2 });
    const reference = await runSweep(sweep, { executor: new InProcessExecutor(solvePoint), runtime, segmentLength: 2 });
    expect(pooled.cancelled).toBe(false);
    expect(Object.keys(pooled.map.points)).toEqual(Object.keys(reference.map.points));
    for (const [key, p] of Object.entries(reference.map.points)) expect(pooled.map.points[key].energy).toBeCloseTo(p.energy, 9);
    expect(log.started).toBeLessThanOrEqual(3);
    expect(log.segments).toBe(4); // 7 points in segments of 2
    // Free hardcore bosons on an open chain = free fermions (Jordan–Wigner): at V = 0 the energy
    // is the sum of the 3 lowest −2J cos(πk/7), k = 1…6 (standard result; e.g. Lieb, Schultz &
    // Mattis, Ann. Phys. 1961).
    const exact = -2 * [1, 2, 3].reduce((s, k) => s + Math.cos((Math.PI * k) / 7), 0);
    expect(pooled.map.points['V=0'].energy).toBeCloseTo(exact, 8);
    await pool.close();
  });

  it('cancel terminates the workers and keeps delivered points; a resume computes only the rest', async () => {
    const log = { started: 0, terminated: 0, segments: 0 };
    const pool = new WorkerPool(fakeWorkerFactory(log), 2);
    const controller = new AbortController();
    let seen = 0;
    const first = await runSweep(sweep, {
      executor: pool,
      runtime,
      segmentLength: 1,
      signal: controller.signal,
      onPoint: () => {
        if (++seen === 3) controller.abort(new Error('cancelled by the user'));
      },
    });
    expect(first.cancelled).toBe(true);
    expect(Object.keys(first.map.points).length).toBe(3);
    expect(log.terminated).toBeGreaterThan(0);
    expect(pool.liveWorkers).toBe(0);
    const second = await runSweep(sweep, { executor: pool, runtime, resume: first.map, segmentLength: 1 });
    expect(second.skipped).toBe(3);
    expect(second.computed).toBe(4);
    expect(Object.keys(second.map.points).length).toBe(7);
    await pool.close();
  });

  it('pause holds back new segments until resume', async () => {
    const log = { started: 0, terminated: 0, segments: 0 };
    const pool = new WorkerPool(fakeWorkerFactory(log), 2);
    pool.pause();
    const done = runSweep(sweep, { executor: pool, runtime, segmentLength: 1 });
    await new Promise((r) => setTimeout(r, 30));
    expect(log.segments).toBe(0);
    expect(pool.isPaused).toBe(true);
    pool.resume();
    const outcome = await done;
    expect(outcome.computed).toBe(7);
    await pool.close();
  });

  it('a worker failure rejects the run and stops the other workers', async () => {
    const pool = new WorkerPool(() => ({
      runSegment: () => Promise.reject(new Error('worker crashed')),
      solveDetail: () => Promise.reject(new Error('unused')),
      terminate: () => {},
    }), 2);
    await expect(runSweep(sweep, { executor: pool, runtime })).rejects.toThrow('worker crashed');
  });
});
