/** Start, pause, resume and cancel a sweep; a progress bar with points done, rate and ETA. */
import { useEffect, useRef, useSyncExternalStore } from 'react';
import { Button } from '../../../components/ui/button.js';
import { useRun } from '../api/sweeps.js';
import { cancelRun, getLiveRun, isActive, pauseRun, resumeRun, startRun, subscribe } from '../lib/run-manager.js';
import { formatDuration, formatRate, progressFigures } from '../workers/eta.js';

export function SweepControls({ sweepId }: { sweepId: string }) {
  const live = useSyncExternalStore(subscribe, () => getLiveRun(sweepId));
  const stored = useRun(sweepId);
  const autoResumed = useRef(false);

  // A run that was going when the tab closed (state still 'running', nothing active here) resumes.
  useEffect(() => {
    if (autoResumed.current || stored === undefined) return;
    autoResumed.current = true;
    if (stored?.state === 'running' && !isActive(sweepId)) void startRun(sweepId);
  }, [stored, sweepId]);

  const running = isActive(sweepId);
  const state = live?.state ?? stored?.state ?? 'new';
  const figures = live?.figures ?? progressFigures(stored?.done ?? 0, stored?.total ?? 0, stored?.failed ?? 0, 0);
  const pct = Math.round(figures.fraction * 100);

  return (
    <section className="space-y-3 rounded-xl border border-line bg-surface p-4" aria-label="Run" data-run-state={state}>
      <div className="flex flex-wrap items-center gap-2">
        {!running && (state === 'new' || state === 'cancelled' || state === 'failed' || state === 'done') ? (
          <Button onClick={() => void startRun(sweepId)}>{state === 'new' ? 'Start' : state === 'done' ? 'Run again (fills gaps only)' : 'Start again from stored points'}</Button>
        ) : null}
        {running && state === 'running' ? (
          <Button variant="secondary" onClick={() => void pauseRun(sweepId)}>
            Pause
          </Button>
        ) : null}
        {state === 'paused' ? <Button onClick={() => void resumeRun(sweepId)}>Resume</Button> : null}
        {running ? (
          <Button variant="ghost" onClick={() => void cancelRun(sweepId)}>
            Cancel
          </Button>
        ) : null}
        <span className="ml-auto text-sm font-semibold text-ink-800" data-testid="run-state">
          {stateText(state, running)}
        </span>
      </div>
      <div>
        <div className="h-2.5 overflow-hidden rounded-full bg-ink-100" role="progressbar" aria-label="Points done" aria-valuemin={0} aria-valuemax={figures.total} aria-valuenow={figures.done}>
          <div className="h-full rounded-full bg-accent-600 transition-[width]" style={{ width: `${pct}%` }} />
        </div>
        <p className="mt-1.5 flex flex-wrap gap-x-4 text-sm text-ink-700" data-testid="run-figures">
          <span>
            <strong data-testid="points-done">{figures.done}</strong> of {figures.total || '…'} points
          </span>
          {figures.failed ? <span className="text-red-800">{figures.failed} failed</span> : null}
          {running ? <span>{formatRate(figures.rate)}</span> : null}
          {running && state === 'running' ? <span>about {formatDuration(figures.etaS)} left</span> : null}
          {live?.round ? <span>refinement round {live.round}</span> : null}
          {running ? <span>{live?.workers ?? 1} workers</span> : null}
        </p>
        {live?.error ?? stored?.error ? <p className="mt-1 text-sm text-red-800">{live?.error ?? stored?.error}</p> : null}
      </div>
    </section>
  );
}

function stateText(state: string, running: boolean): string {
  switch (state) {
    case 'running':
      return running ? 'Running' : 'Interrupted — resuming…';
    case 'paused':
      return running ? 'Pausing: running segments finish' : 'Paused';
    case 'done':
      return 'Finished';
    case 'cancelled':
      return 'Cancelled';
    case 'failed':
      return 'Failed';
    default:
      return 'Not started';
  }
}
