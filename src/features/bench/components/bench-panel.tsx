import { useId, type ReactNode } from 'react';

/** A titled part of the Bench, denser than a page section; named by its heading, so it is a landmark. */
export function BenchPanel({
  title,
  actions,
  children,
  className = '',
  testId,
}: {
  title: string;
  actions?: ReactNode;
  children: ReactNode;
  className?: string;
  testId?: string;
}) {
  const id = useId();
  return (
    <section aria-labelledby={id} data-testid={testId} className={`rounded-lg border border-ink-800 bg-ink-900 px-4 py-3 ${className}`}>
      <div className="mb-2.5 flex min-h-7 items-center gap-2">
        <h2 id={id} className="text-sm font-medium tracking-wide text-mist-100">
          {title}
        </h2>
        {actions && <div className="ml-auto flex items-center gap-1.5">{actions}</div>}
      </div>
      {children}
    </section>
  );
}

export const toolButtonClass = (active = false) =>
  `inline-flex h-7 items-center justify-center gap-1 rounded-md border px-2 text-xs font-medium transition-colors disabled:cursor-not-allowed disabled:opacity-40 ${
    active ? 'border-accent/70 bg-accent/15 text-accent-strong' : 'border-ink-700 bg-ink-850 text-mist-300 hover:border-ink-600 hover:text-mist-100'
  }`;

export const smallInputClass = (invalid = false) =>
  `h-7 rounded-md border bg-ink-950 px-2 font-mono text-xs text-mist-100 placeholder:text-mist-500 focus:border-accent ${invalid ? 'border-danger' : 'border-ink-700'}`;

export const smallSelectClass = 'h-7 rounded-md border border-ink-700 bg-ink-950 px-1.5 text-xs text-mist-100 focus:border-accent';
