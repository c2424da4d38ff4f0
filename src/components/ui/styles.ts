// Class strings shared by several screens, kept here so component files export components only.

/** A bordered panel: the sign-in card, a page section. */
export const cardClass = 'flex flex-col gap-4 rounded-lg border border-ink-800 bg-ink-900 p-6';

/** For selects inside tables, which carry an aria-label instead of a visible label. */
export const compactSelectClass =
  'rounded-md border border-ink-700 bg-ink-900 px-2 py-1 text-sm text-mist-100 focus:border-accent disabled:text-mist-500';

export const tableHeadRowClass = 'border-b border-ink-700 text-left text-xs uppercase tracking-wider text-mist-500';

export const linkClass = 'text-accent hover:underline';
