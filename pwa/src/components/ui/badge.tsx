import type { ReactNode } from 'react';

export type BadgeTone = 'good' | 'bad' | 'warn' | 'neutral';

const toneClasses: Record<BadgeTone, string> = {
  good: 'bg-good-50 text-good-700 ring-good-300',
  bad: 'bg-red-50 text-red-800 ring-red-300',
  warn: 'bg-amber-50 text-amber-900 ring-amber-300',
  neutral: 'bg-ink-100 text-ink-800 ring-line',
};

const dotClasses: Record<BadgeTone, string> = {
  good: 'bg-good-600',
  bad: 'bg-red-600',
  warn: 'bg-amber-500',
  neutral: 'bg-ink-500',
};

/** A small pill; the words carry the meaning, the colour only repeats it. */
export function Badge({ tone, children }: { tone: BadgeTone; children: ReactNode }) {
  return (
    <span
      className={`inline-flex items-center gap-1.5 rounded-full px-2.5 py-0.5 text-sm font-semibold ring-1 ring-inset ${toneClasses[tone]}`}
    >
      <span aria-hidden="true" className={`size-2 rounded-full ${dotClasses[tone]}`} />
      {children}
    </span>
  );
}
