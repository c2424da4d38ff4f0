import { MARK_TEXT_MAX } from '../../../../server/schemas/views';
import { TextField } from '../../../components/ui/text-field';
import { useBench, useBenchActions } from '../session/bench-session';
import { BenchPanel } from './bench-panel';
import { GuideMarkPicker, markableGuides, PendingMarks, SavedMarks } from './bench-marks';

/** Beside the map while marking (or with marks about): the next mark's text, the guide marks, the marks so far. */
export function MarkTools() {
  const a = useBenchActions();
  const mode = useBench((s) => s.mode);
  const marks = useBench((s) => s.marks);
  const savedMarks = useBench((s) => s.savedMarks);
  const fromView = useBench((s) => s.fromView);
  const against = useBench((s) => s.against);
  const markText = useBench((s) => s.markText);
  const lines = useBench((s) => s.lines);
  const firstPending = useBench((s) => s.firstPending);
  if (mode !== 'mark' && marks.length === 0 && savedMarks.marks.length === 0) return null;
  return (
    <BenchPanel title="Marks">
      <div className="flex flex-col gap-3" data-testid="mark-tools">
        {fromView && <SavedMarks fromView={fromView} marks={savedMarks} against={fromView.restore.against ?? against} />}
        <div className="flex flex-wrap items-end gap-3">
          <TextField
            label="Mark text"
            className="min-w-56 flex-1"
            maxLength={MARK_TEXT_MAX}
            value={markText}
            onChange={(e) => a.setMarkText(e.target.value)}
            placeholder="The text of the next mark you place"
          />
          <p className="pb-2 text-xs text-mist-500">
            {mode === 'mark' ? 'Click the map for a point, Shift-drag for a box, or mark a whole guide.' : 'Choose Add mark (m) to place more.'} Marks are saved with the view.
          </p>
          <div className="pb-1">
            <GuideMarkPicker guides={markableGuides(lines)} onMark={(g) => a.addMark({ kind: 'guide', guide: g.guide, label: g.label })} />
          </div>
        </div>
        <PendingMarks marks={marks} firstNumber={firstPending} against={against} onChange={a.setMarks} />
      </div>
    </BenchPanel>
  );
}
