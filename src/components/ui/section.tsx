import { useId, type ReactNode } from 'react';

/** A titled panel of a page; named by its heading, so it is a landmark one can find by name. */
export function Section({ title, children, className = '' }: { title: string; children: ReactNode; className?: string }) {
  const id = useId();
  return (
    <section aria-labelledby={id} className={`rounded-lg border border-ink-800 bg-ink-900 p-5 ${className}`}>
      <h2 id={id} className="mb-3 text-base font-medium">
        {title}
      </h2>
      {children}
    </section>
  );
}
