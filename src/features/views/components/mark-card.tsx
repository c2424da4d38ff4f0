import type { ReactNode } from 'react';
import type { GuideRef, Mark } from '../../../../server/schemas/views';
import { formatDateTime } from '../../../lib/format';
import { formatAxisValue, type AxisSpec } from '../snapshot/axes';
import { guideLabel } from '../snapshot/guide-lines';
import type { PendingPlace } from './snapshot-figure';

const kindName = { point: 'Point', box: 'Box', guide: 'Guide' } as const;

/** Where a mark sits, in words and the axes' units. */
export function describePlace(place: Pick<Mark, 'kind' | 'geometry'> | PendingPlace, axes: { x: AxisSpec; y: AxisSpec }): string {
  if (place.kind === 'point') {
    const g = place.geometry as { x: number; y: number };
    return `at ${formatAxisValue(axes.x, g.x)}, ${formatAxisValue(axes.y, g.y)}`;
  }
  if (place.kind === 'box') {
    const g = place.geometry as { x0: number; x1: number; y0: number; y1: number };
    return `${formatAxisValue(axes.x, g.x0)} – ${formatAxisValue(axes.x, g.x1)}, ${formatAxisValue(axes.y, g.y0)} – ${formatAxisValue(axes.y, g.y1)}`;
  }
  return `on the guide ${guideLabel((place.geometry as { guide: GuideRef }).guide)}`;
}

/** The mark's text as written. */
export function MarkText({ mark }: { mark: Mark }) {
  return (
    <p className="mt-1 whitespace-pre-line break-words text-sm text-mist-100">
      {mark.text || <span className="text-mist-500">No text.</span>}
    </p>
  );
}

export function MarkByline({ mark }: { mark: Mark }) {
  return (
    <p className="mt-1 text-xs text-mist-500">
      {mark.author?.name ?? 'Someone'} ·{' '}
      <time dateTime={mark.createdAt} className="font-mono">
        {formatDateTime(mark.createdAt)}
      </time>
      {mark.version > 1 && <span> · edited</span>}
    </p>
  );
}

interface MarkCardProps {
  mark: Mark;
  /** 1-based, as drawn on the map. */
  number: number;
  axes: { x: AxisSpec; y: AxisSpec };
  selected: boolean;
  onSelect: () => void;
  /** In place of the text and byline: the same with edit and delete, for those allowed. */
  body?: ReactNode;
  /** The thread under the mark. */
  children?: ReactNode;
}

export function MarkCard({ mark, number, axes, selected, onSelect, body, children }: MarkCardProps) {
  return (
    <li
      id={`mark-card-${mark.id}`}
      data-testid={selected ? 'selected-mark' : 'mark-card'}
      data-mark-id={mark.id}
      className={`scroll-mt-4 rounded-lg border px-4 py-3 ${selected ? 'border-accent/60 bg-ink-850' : 'border-ink-800 bg-ink-900'}`}
    >
      <div className="flex items-start gap-3">
        <button
          type="button"
          onClick={onSelect}
          aria-pressed={selected}
          aria-label={`Select mark ${number}`}
          className={`mt-0.5 flex h-6 w-6 shrink-0 items-center justify-center rounded-full font-mono text-xs font-semibold ring-1 ${
            selected ? 'bg-accent text-ink-950 ring-accent' : 'text-mist-100 ring-ink-600 hover:ring-mist-300'
          }`}
        >
          {number}
        </button>
        <div className="min-w-0 flex-1">
          <p className="flex flex-wrap items-baseline gap-x-2 text-xs text-mist-500">
            <span className="text-mist-300">{kindName[mark.kind]}</span>
            <span className="font-mono">{describePlace(mark, axes)}</span>
          </p>
          {body ?? (
            <>
              <MarkText mark={mark} />
              <MarkByline mark={mark} />
            </>
          )}
        </div>
      </div>
      {children && <div className="mt-3 border-t border-ink-800 pt-3 sm:pl-9">{children}</div>}
    </li>
  );
}
