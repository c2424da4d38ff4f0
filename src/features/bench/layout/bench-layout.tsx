import { useRef, type KeyboardEvent, type PointerEvent, type ReactNode } from 'react';
import { BenchLayoutContext, RIGHT_MAX_PX, RIGHT_MIN_PX, useBenchLayoutState } from './use-bench-layout';

export interface SideSection {
  id: string;
  label: string;
  content: ReactNode;
}

const railButton = (active: boolean) =>
  `flex w-8 items-center justify-center rounded-md border py-3 text-xs font-medium tracking-wide [writing-mode:vertical-rl] [transform:rotate(180deg)] transition-colors ${
    active ? 'border-accent/70 bg-accent/15 text-accent-strong' : 'border-ink-800 bg-ink-900 text-mist-300 hover:border-ink-600 hover:text-mist-100'
  }`;

/**
 * The Bench on a wide screen: the map in the middle takes what is left of the window; the recordings,
 * setup and keeping sections fold into a rail on the left (those opened stack beside it); the guides, tracks and
 * findings sit in a column on the right that can be widened by its edge or folded to a rail. The page
 * itself does not scroll; each column scrolls on its own. On a narrow screen everything stacks.
 * The arrangement is remembered per user (use-bench-layout.ts).
 */
export function BenchLayout({ left, centre, right }: { left: SideSection[]; centre: ReactNode; right: ReactNode }) {
  const state = useBenchLayoutState();
  const [prefs, update] = state;
  const open = left.filter((s) => prefs.left.includes(s.id));
  const isOpen = (id: string) => prefs.left.includes(id);
  const drag = useRef<{ x: number; width: number } | null>(null);

  const onPointerDown = (e: PointerEvent<HTMLDivElement>) => {
    e.currentTarget.setPointerCapture(e.pointerId);
    drag.current = { x: e.clientX, width: prefs.rightWidthPx };
  };
  const onPointerMove = (e: PointerEvent<HTMLDivElement>) => {
    const d = drag.current;
    if (!d) return;
    update({ rightWidthPx: Math.round(Math.min(RIGHT_MAX_PX, Math.max(RIGHT_MIN_PX, d.width + d.x - e.clientX))) });
  };
  const onKey = (e: KeyboardEvent<HTMLDivElement>) => {
    const step = e.key === 'ArrowLeft' ? 16 : e.key === 'ArrowRight' ? -16 : 0;
    if (!step) return;
    e.preventDefault();
    update({ rightWidthPx: Math.min(RIGHT_MAX_PX, Math.max(RIGHT_MIN_PX, prefs.rightWidthPx + step)) });
  };

  return (
    <BenchLayoutContext.Provider value={state}>
      <div className="flex flex-col gap-2 lg:h-full lg:min-h-0 lg:flex-row" data-testid="bench-layout">
        <nav aria-label="Bench sections" className="flex gap-1 lg:flex-col">
          {left.map((s) => (
            <button
              key={s.id}
              type="button"
              className={railButton(isOpen(s.id))}
              aria-expanded={isOpen(s.id)}
              aria-controls={`bench-section-${s.id}`}
              onClick={() => update({ left: isOpen(s.id) ? prefs.left.filter((id) => id !== s.id) : [...prefs.left, s.id] })}
            >
              {s.label}
            </button>
          ))}
        </nav>
        {open.length > 0 && (
          <div className="flex shrink-0 flex-col gap-3 lg:w-[18rem] lg:overflow-y-auto lg:pr-1">
            {open.map((s) => (
              <div key={s.id} id={`bench-section-${s.id}`} role="region" aria-label={s.label} className="flex flex-col gap-3">
                {s.content}
              </div>
            ))}
          </div>
        )}
        <div className="flex min-w-0 flex-1 flex-col gap-2 lg:overflow-y-auto" data-testid="bench-centre">
          {centre}
        </div>
        {prefs.rightOpen ? (
          <>
            <div
              role="separator"
              aria-orientation="vertical"
              aria-label="Width of the side column"
              aria-valuemin={RIGHT_MIN_PX}
              aria-valuemax={RIGHT_MAX_PX}
              aria-valuenow={prefs.rightWidthPx}
              tabIndex={0}
              className="hidden w-1.5 shrink-0 cursor-col-resize rounded-full bg-ink-800 hover:bg-accent/50 focus:bg-accent/60 lg:block"
              onPointerDown={onPointerDown}
              onPointerMove={onPointerMove}
              onPointerUp={() => (drag.current = null)}
              onKeyDown={onKey}
            />
            <aside className="flex shrink-0 flex-col gap-3 lg:min-h-0 lg:overflow-hidden lg:[width:var(--right-width)]" style={{ '--right-width': `${prefs.rightWidthPx}px` } as React.CSSProperties} data-testid="bench-right">
              <button type="button" className="-mb-2 shrink-0 self-end rounded px-1.5 text-[11px] leading-4 text-mist-500 hover:bg-ink-800 hover:text-mist-100" onClick={() => update({ rightOpen: false })}>
                Fold this column
              </button>
              {right}
            </aside>
          </>
        ) : (
          <nav aria-label="Side column" className="flex lg:flex-col">
            <button type="button" className={railButton(false)} aria-expanded={false} onClick={() => update({ rightOpen: true })}>
              Guides, tracks, findings
            </button>
          </nav>
        )}
      </div>
    </BenchLayoutContext.Provider>
  );
}
