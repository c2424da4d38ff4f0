import type { GuideRef } from '../../../../server/schemas/views';
import { sameGuide, type GuideLine } from '../snapshot/guide-lines';

/** The view's guides: drawn, hidden, or listed with the reason they cannot be drawn on this snapshot. */
export function GuidesList({
  lines,
  highlighted,
  onMarkGuide,
}: {
  lines: GuideLine[];
  highlighted: GuideRef | null;
  /** Given: each guide offers to become a guide mark. */
  onMarkGuide?: (guide: GuideRef) => void;
}) {
  if (lines.length === 0) return <p className="text-sm text-mist-500">The view has no guides.</p>;
  return (
    <ul className="flex flex-col divide-y divide-ink-800 text-sm" data-testid="view-guides">
      {lines.map((g) => {
        const on = highlighted !== null && sameGuide(highlighted, g.guide);
        return (
          <li key={g.key} className="flex flex-wrap items-baseline gap-x-3 gap-y-0.5 py-1.5">
            <span className={`font-mono ${on ? 'text-accent' : 'text-mist-100'}`}>{g.label}</span>
            {g.name && <span className="text-mist-300">{g.name}</span>}
            <span className="text-xs text-mist-500">
              {!g.visible ? 'hidden in the view' : g.polylines.length > 0 ? 'drawn' : g.reason}
            </span>
            {onMarkGuide && (
              <button
                type="button"
                className="ml-auto text-xs text-accent hover:underline"
                onClick={() => onMarkGuide(g.guide)}
                aria-label={`Mark the guide ${g.label}`}
              >
                Mark this guide
              </button>
            )}
          </li>
        );
      })}
    </ul>
  );
}
