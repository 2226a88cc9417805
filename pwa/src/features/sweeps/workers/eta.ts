/**
 * Progress of a running sweep: points done of the total, the rate over a sliding window (so a
 * pause, a resume or a slow refinement round does not distort it for long) and the time left.
 */
export interface ProgressFigures {
  done: number;
  total: number;
  failed: number;
  /** 0…1 */
  fraction: number;
  /** Points per second over the window; 0 before two samples. */
  rate: number;
  /** Seconds left at that rate; NaN while unknown. */
  etaS: number;
}

export class RateMeter {
  private samples: { t: number; done: number }[] = [];

  /** @param windowMs how far back the rate looks. @default 20000 */
  constructor(private readonly windowMs = 20_000) {}

  /** Forget the past (after a pause: the paused time must not count). */
  reset(): void {
    this.samples = [];
  }

  /** Records that `done` points were finished at time `tMs`. */
  record(done: number, tMs: number): void {
    const last = this.samples.at(-1);
    if (last && tMs < last.t) throw new RangeError('RateMeter.record: time went backwards');
    this.samples.push({ t: tMs, done });
    // Keep the newest sample older than the window as the left edge.
    while (this.samples.length > 2 && this.samples[1].t <= tMs - this.windowMs) this.samples.shift();
  }

  /** Points per second between the oldest sample kept and the newest. */
  rate(): number {
    if (this.samples.length < 2) return 0;
    const a = this.samples[0];
    const b = this.samples[this.samples.length - 1];
    const dt = (b.t - a.t) / 1000;
    return dt > 0 ? Math.max(0, b.done - a.done) / dt : 0;
  }
}

export function progressFigures(done: number, total: number, failed: number, rate: number): ProgressFigures {
  const remaining = Math.max(0, total - done);
  return {
    done,
    total,
    failed,
    fraction: total > 0 ? Math.min(1, done / total) : 0,
    rate,
    etaS: remaining === 0 ? 0 : rate > 0 ? remaining / rate : Number.NaN,
  };
}

/** "2 h 05 min", "3 min 07 s", "12 s", "—" for unknown. */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds) || seconds < 0) return '—';
  const s = Math.round(seconds);
  if (s < 60) return `${s} s`;
  const m = Math.floor(s / 60);
  if (m < 60) return `${m} min ${String(s % 60).padStart(2, '0')} s`;
  const h = Math.floor(m / 60);
  return `${h} h ${String(m % 60).padStart(2, '0')} min`;
}

/** "3.2 points/s", "14 points/min" for slow runs. */
export function formatRate(rate: number): string {
  if (!(rate > 0)) return '—';
  if (rate >= 1) return `${rate >= 10 ? Math.round(rate) : rate.toFixed(1)} points/s`;
  const perMin = rate * 60;
  return `${perMin >= 10 ? Math.round(perMin) : perMin.toFixed(1)} points/min`;
}
