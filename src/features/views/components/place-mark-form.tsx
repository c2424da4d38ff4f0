import { useState, type FormEvent } from 'react';
import { MARK_TEXT_MAX } from '../../../../server/schemas/views';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { TextField } from '../../../components/ui/text-field';
import type { AxisSpec } from '../snapshot/axes';
import { describePlace } from './mark-card';
import type { PendingPlace } from './snapshot-figure';

/** Places the pending mark with a text: the place comes from the map (click, Shift-drag) or a guide. */
export function PlaceMarkForm({
  pending,
  axes,
  onClear,
  onPlace,
}: {
  pending: PendingPlace | null;
  axes: { x: AxisSpec; y: AxisSpec };
  onClear: () => void;
  onPlace: (text: string) => Promise<unknown>;
}) {
  const [text, setText] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const submit = async (e: FormEvent) => {
    e.preventDefault();
    if (!pending) return;
    setProblem(null);
    setBusy(true);
    try {
      await onPlace(text);
      setText('');
    } catch (err) {
      setProblem(err instanceof Error ? err.message : 'The mark could not be placed.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-2 rounded-md border border-ink-800 bg-ink-950/40 p-3" aria-label="Place a mark">
      <p className="text-xs text-mist-500" data-testid="pending-place">
        {pending ? (
          <>
            New {pending.kind} mark <span className="font-mono text-mist-300">{describePlace(pending, axes)}</span>
          </>
        ) : (
          'Click the map for a point, Shift-drag for a box, or choose “Mark this guide” under Guides.'
        )}
      </p>
      {problem && <Notice tone="error">{problem}</Notice>}
      <div className="flex flex-wrap items-end gap-3">
        <TextField
          label="Mark text"
          className="min-w-56 flex-1"
          maxLength={MARK_TEXT_MAX}
          value={text}
          onChange={(e) => setText(e.target.value)}
          placeholder="What is here? Write @name to tell a member."
        />
        <Button type="submit" disabled={!pending || busy}>
          {busy ? 'Placing…' : 'Place mark'}
        </Button>
        {pending && (
          <Button type="button" variant="quiet" onClick={onClear}>
            Cancel
          </Button>
        )}
      </div>
    </form>
  );
}
