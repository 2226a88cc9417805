import type { ReactNode } from 'react';

interface CardProps {
  title: ReactNode;
  /** Shown at the right of the title row (a badge, a button). */
  aside?: ReactNode;
  children: ReactNode;
  className?: string;
  /** Forwarded as data-* attributes for tests and styling hooks. */
  data?: Record<string, string>;
}

export function Card({ title, aside, children, className = '', data = {} }: CardProps) {
  const dataAttributes = Object.fromEntries(Object.entries(data).map(([key, value]) => [`data-${key}`, value]));
  return (
    <section
      className={`rounded-xl border border-line bg-surface p-5 shadow-[0_1px_2px_rgb(18_52_59/0.06)] ${className}`}
      {...dataAttributes}
    >
      <div className="mb-3 flex items-center justify-between gap-3">
        <h2 className="text-base font-semibold text-ink-900">{title}</h2>
        {aside}
      </div>
      {children}
    </section>
  );
}
