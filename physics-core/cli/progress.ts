/** A progress line on stderr: bar, done/total, rate and ETA; redrawn in place on a terminal. */
import type { Progress } from '../src/sweep/run.js';

export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds)) return '--';
  const s = Math.round(seconds);
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const r = s % 60;
  return h > 0 ? `${h}h${String(m).padStart(2, '0')}m` : m > 0 ? `${m}m${String(r).padStart(2, '0')}s` : `${r}s`;
}

export function formatProgress(p: Progress, width = 24): string {
  const frac = p.total > 0 ? p.done / p.total : 0;
  const filled = Math.round(frac * width);
  const bar = `${'#'.repeat(filled)}${'.'.repeat(width - filled)}`;
  const round = p.round > 0 ? ` refine ${p.round}` : '';
  const extra = [p.skipped ? `${p.skipped} resumed` : '', p.failed ? `${p.failed} failed` : ''].filter(Boolean).join(', ');
  return `[${bar}] ${p.done}/${p.total}${round} ${p.rate.toFixed(p.rate < 10 ? 2 : 0)} pt/s ETA ${formatDuration(p.etaS)}${extra ? ` (${extra})` : ''}`;
}

/** Returns an `onProgress` callback drawing to `stream` (at most every `minMs` unless finished) and a `done()` to end the line. */
export function progressReporter(stream: NodeJS.WriteStream = process.stderr, minMs = 200) {
  let last = 0;
  let shown = false;
  const tty = Boolean(stream.isTTY);
  return {
    onProgress(p: Progress) {
      const t = Date.now();
      if (p.done < p.total && t - last < (tty ? minMs : 5000)) return;
      last = t;
      shown = true;
      stream.write(tty ? `\r${formatProgress(p)}\x1b[K` : `${formatProgress(p)}\n`);
    },
    done() {
      if (shown && tty) stream.write('\n');
    },
  };
}
