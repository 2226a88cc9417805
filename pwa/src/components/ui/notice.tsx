import type { ReactNode } from 'react';

export type NoticeTone = 'info' | 'warn' | 'error';

const toneClasses: Record<NoticeTone, string> = {
  info: 'border-ink-500 bg-surface text-ink-900 ring-1 ring-line',
  warn: 'border-amber-300 bg-amber-50 text-amber-950',
  error: 'border-red-300 bg-red-50 text-red-950',
};

/** A callout. `role="alert"` only for errors that appear after an action. */
export function Notice({
  tone,
  title,
  children,
  live = false,
}: {
  tone: NoticeTone;
  title: ReactNode;
  children?: ReactNode;
  live?: boolean;
}) {
  return (
    <div className={`rounded-lg border-l-4 p-4 ${toneClasses[tone]}`} role={live ? (tone === 'error' ? 'alert' : 'status') : undefined}>
      <p className="font-semibold">{title}</p>
      {children ? <div className="mt-1 text-sm leading-relaxed">{children}</div> : null}
    </div>
  );
}
