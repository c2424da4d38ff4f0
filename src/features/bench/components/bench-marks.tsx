import { useState } from 'react';
import type { GuideRef } from '../../../../server/schemas/views';
import { Link } from 'react-router-dom';
import { MARK_TEXT_MAX, type Mark } from '../../../../server/schemas/views';
import { Notice } from '../../../components/ui/notice';
import { linkClass } from '../../../components/ui/styles';
import { paths } from '../../../config/paths';
import { useMe } from '../../auth/api/auth';
import { useProject } from '../../projects/api/projects';
import { EditableMarkBody, MarkByline, MarkText } from '../../views';
import { markOnMap, type ViewOnBench } from '../view-state/view-restore';
import type { SavedMarksOnMap } from '../session/use-saved-marks';
import type { GuideLine } from '../map/guides';
import type { BenchMark } from '../view-state/view-snapshot';
import { smallInputClass, smallSelectClass } from './bench-panel';

const placeText = (m: BenchMark, against: 'time' | 'speed') => {
  if (m.kind === 'guide') return `on ${m.label}`;
  const unit = against === 'speed' ? 'rpm' : 's';
  const digits = against === 'speed' ? 0 : 2;
  return m.kind === 'point'
    ? `${m.x.toFixed(digits)} ${unit}, ${Math.round(m.f)} Hz`
    : `${m.x0.toFixed(digits)}–${m.x1.toFixed(digits)} ${unit}, ${Math.round(m.f0)}–${Math.round(m.f1)} Hz`;
};

/**
 * The saved view's marks on the Bench: each one's text, editable there by its author or a lead (the
 * same editor as the view page, with its version check), and a link to its thread on the view page.
 */
export function SavedMarks({ fromView, marks, against }: { fromView: ViewOnBench; marks: SavedMarksOnMap; against: 'time' | 'speed' }) {
  const { data: me } = useMe();
  const project = useProject(fromView.view.projectId);
  const role = project.data?.role ?? null;
  const open = !fromView.view.archived;
  const mayEdit = (m: Mark) => open && (role === 'lead' || (role === 'engineer' && m.author?.id === me?.id));
  if (marks.error) return <Notice tone="error">The marks of the view cannot be read: {marks.error.message}</Notice>;
  if (marks.isPending) return <p className="text-xs text-mist-500">Loading the marks of the view…</p>;
  if (marks.marks.length === 0) return null;
  return (
    <section aria-label="Marks of the saved view" data-testid="saved-marks">
      <h3 className="mb-1 text-xs font-medium text-mist-300">
        Marks of{' '}
        <Link to={paths.view(fromView.view.id)} className={linkClass}>
          {fromView.view.title}
        </Link>
      </h3>
      <ol className="flex flex-col gap-2">
        {marks.marks.map((m, i) => {
          const placed = markOnMap(m, fromView.restore.swapped);
          return (
            <li key={m.id} className="rounded-md border border-ink-800 px-3 py-2" data-testid={`saved-mark-${m.id}`}>
              <p className="flex flex-wrap items-center gap-x-2 text-xs text-mist-500">
                <span className="font-mono text-accent">{i + 1}</span>
                <span className="font-mono">{placed ? placeText(placed, fromView.restore.against) : 'not on this map'}</span>
                {placed && placed.kind !== 'guide' && against !== fromView.restore.against && <span>(placed on the map against {fromView.restore.against})</span>}
                <Link to={paths.view(fromView.view.id, m.id)} className={`${linkClass} ml-auto`}>
                  Thread ({m.commentCount})
                </Link>
              </p>
              {mayEdit(m) ? (
                <EditableMarkBody viewId={fromView.view.id} mark={m} number={i + 1} />
              ) : (
                <>
                  <MarkText mark={m} />
                  <MarkByline mark={m} />
                </>
              )}
            </li>
          );
        })}
      </ol>
    </section>
  );
}

/** Marks placed on this Bench and not saved yet: their text stays editable until the view is saved. */
export function PendingMarks({
  marks,
  firstNumber,
  against,
  onChange,
}: {
  marks: BenchMark[];
  firstNumber: number;
  against: 'time' | 'speed';
  onChange: (update: (marks: BenchMark[]) => BenchMark[]) => void;
}) {
  if (marks.length === 0) return null;
  return (
    <ol className="flex flex-col gap-1 text-xs text-mist-300" data-testid="pending-marks">
      {marks.map((m, i) => {
        const n = firstNumber + i;
        return (
          <li key={m.id} className="flex items-center gap-2">
            <span className="font-mono text-accent">{n}</span>
            <span className="shrink-0 font-mono text-mist-500">{placeText(m, against)}</span>
            <input
              className={`${smallInputClass()} min-w-0 flex-1`}
              aria-label={`Text of pending mark ${n}`}
              maxLength={MARK_TEXT_MAX}
              value={m.text}
              placeholder="(no text)"
              onChange={(e) => {
                const text = e.target.value;
                onChange((ms) => ms.map((x) => (x.id === m.id ? { ...x, text } : x)));
              }}
            />
            <button
              type="button"
              className="rounded px-1.5 text-mist-500 hover:bg-ink-800 hover:text-mist-100"
              aria-label={`Remove mark ${n}`}
              onClick={() => onChange((ms) => ms.filter((x) => x.id !== m.id))}
            >
              Remove
            </button>
          </li>
        );
      })}
    </ol>
  );
}

/** A line the map shows that a guide mark can be put on (orders and electrical carrier families). */
export interface MarkableGuide {
  id: string;
  label: string;
  guide: GuideRef;
}

export function markableGuides(lines: GuideLine[]): MarkableGuide[] {
  const out: MarkableGuide[] = [];
  const seen = new Set<string>();
  for (const l of lines) {
    const g = l.guide;
    const ref: GuideRef | null = g.kind === 'order' ? { kind: 'order', order: g.order } : g.per === 'electrical' ? { kind: 'family', m: g.m, n: g.n } : null;
    if (!ref) continue;
    const key = JSON.stringify(ref);
    if (seen.has(key)) continue; // the same family on two carriers is one guide in a view
    seen.add(key);
    out.push({ id: l.id, label: l.label, guide: ref });
  }
  return out;
}

/** Puts a mark on a whole guide line, with the text of the next mark. */
export function GuideMarkPicker({ guides, onMark }: { guides: MarkableGuide[]; onMark: (g: MarkableGuide) => void }) {
  const [chosen, setChosen] = useState('');
  if (guides.length === 0) return null;
  const pick = guides.find((g) => g.id === chosen) ?? guides[0];
  return (
    <div className="flex items-center gap-2 text-xs text-mist-500">
      <select className={smallSelectClass} aria-label="Guide to mark" value={pick.id} onChange={(e) => setChosen(e.target.value)}>
        {guides.map((g) => (
          <option key={g.id} value={g.id}>
            {g.label}
          </option>
        ))}
      </select>
      <button type="button" className="rounded px-2 py-1 text-mist-300 hover:bg-ink-800 hover:text-mist-100" onClick={() => onMark(pick)}>
        Mark guide
      </button>
    </div>
  );
}
