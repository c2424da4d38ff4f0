import { useState } from 'react';
import { MARK_TEXT_MAX, type Mark } from '../../../../server/schemas/views';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { useDeleteMark, useUpdateMarkText } from '../api/marks';
import { ConflictWithCurrent } from '../../../lib/api-client';
import { MarkByline, MarkText } from './mark-card';

/** A mark's text and byline with Edit and Delete, for its author or a lead. */
export function EditableMarkBody({ viewId, mark, number }: { viewId: number; mark: Mark; number: number }) {
  const update = useUpdateMarkText(viewId);
  const remove = useDeleteMark(viewId);
  const [editing, setEditing] = useState(false);
  const [draft, setDraft] = useState(mark.text);
  // the version the draft was written against; a 409 moves it to the newer one
  const [version, setVersion] = useState(mark.version);
  const [note, setNote] = useState<{ tone: 'info' | 'error'; text: string } | null>(null);
  const [confirming, setConfirming] = useState(false);

  const start = () => {
    setDraft(mark.text);
    setVersion(mark.version);
    setNote(null);
    setEditing(true);
  };
  const save = () => {
    setNote(null);
    update.mutate(
      { id: mark.id, version, text: draft },
      {
        onSuccess: () => setEditing(false),
        onError: (e) => {
          if (e instanceof ConflictWithCurrent) {
            const current = e.current as Mark;
            setDraft(current.text);
            setVersion(current.version);
            setNote({ tone: 'info', text: 'Someone changed this mark; here is the newer text.' });
          } else {
            setNote({ tone: 'error', text: e.message });
          }
        },
      },
    );
  };

  if (editing) {
    return (
      <div className="mt-2 flex flex-col gap-2">
        {note && <Notice tone={note.tone}>{note.text}</Notice>}
        <TextAreaField
          label={`Text of mark ${number}`}
          rows={3}
          maxLength={MARK_TEXT_MAX}
          value={draft}
          onChange={(e) => setDraft(e.target.value)}
        />
        <div className="flex gap-2">
          <Button type="button" className="px-3 py-1.5" disabled={update.isPending} onClick={save}>
            {update.isPending ? 'Saving…' : 'Save'}
          </Button>
          <Button type="button" variant="quiet" className="px-3 py-1.5" onClick={() => setEditing(false)}>
            Cancel
          </Button>
        </div>
      </div>
    );
  }

  return (
    <>
      <MarkText mark={mark} />
      <MarkByline mark={mark} />
      <div className="mt-1.5 flex flex-wrap items-center gap-3 text-xs">
        {remove.error && <span className="text-danger">{remove.error.message}</span>}
        {confirming ? (
          <>
            <span className="text-mist-300">Delete this mark and its thread?</span>
            <button type="button" className="text-danger hover:underline" onClick={() => remove.mutate(mark.id)} disabled={remove.isPending}>
              Delete
            </button>
            <button type="button" className="text-mist-300 hover:underline" onClick={() => setConfirming(false)}>
              Keep
            </button>
          </>
        ) : (
          <>
            <button type="button" className="text-accent hover:underline" onClick={start} aria-label={`Edit mark ${number}`}>
              Edit
            </button>
            <button
              type="button"
              className="text-mist-300 hover:text-danger hover:underline"
              onClick={() => setConfirming(true)}
              aria-label={`Delete mark ${number}`}
            >
              Delete
            </button>
          </>
        )}
      </div>
    </>
  );
}
