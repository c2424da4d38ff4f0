import type { ReactNode } from 'react';

/** The title of a view with its facts (author, recording, dates) and, for some, actions. */
export function ViewHeading({
  kicker,
  title,
  archived,
  facts,
  actions,
}: {
  kicker?: ReactNode;
  title: string;
  archived: boolean;
  facts: { label: string; value: ReactNode }[];
  actions?: ReactNode;
}) {
  return (
    <header className="mb-6 flex flex-wrap items-start gap-4">
      <div className="min-w-0 flex-1">
        {kicker && <p className="mb-1 text-sm text-mist-500">{kicker}</p>}
        <div className="flex flex-wrap items-center gap-3">
          <h1 className="break-words text-xl font-semibold">{title}</h1>
          {archived && <span className="rounded border border-ink-600 px-1.5 py-0.5 text-xs text-mist-300">archived</span>}
        </div>
        <dl className="mt-2 flex flex-wrap gap-x-6 gap-y-1 text-sm" data-testid="view-facts">
          {facts.map((f) => (
            <div key={f.label} className="flex gap-1.5">
              <dt className="text-mist-500">{f.label}</dt>
              <dd className="text-mist-300">{f.value}</dd>
            </div>
          ))}
        </dl>
      </div>
      {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
    </header>
  );
}
