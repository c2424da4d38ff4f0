import { useState, type FormEvent } from 'react';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import { createViewBody, saveViewChangesBody, type ViewDetail } from '../../../../server/schemas/views';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { ApiError } from '../../../lib/api-client';
import { errorMessage } from '../../../lib/error-message';
import { useMe } from '../../auth/api/auth';
import { useProjects } from '../../projects/api/projects';
import type { LibraryEntry } from '../../library/api/library-store';
import { issuesText, useSaveNewView, useSaveViewChanges } from '../api/save-view';
import type { ViewCapture } from '../session/capture-view';
import type { ViewOnBench } from '../view-state/view-restore';
import { markBody, type BenchMark } from '../view-state/view-snapshot';
import { setupProblems } from './register-form';
import { SaveOutcome, type Outcome } from './save-outcome';

/**
 * Saves what the Bench shows as a view of a project: registers the recording there first when the
 * project does not have it yet, then stores the view, its snapshot and the pending marks in one request
 * (one transaction on the server: all of it or nothing).
 * Opened from a saved view, it can instead save the changes into that view (its author or a lead).
 */
export function SaveViewForm({
  entry,
  setup,
  preferredProjectId,
  capture,
  marks,
  fromView,
  onSaved,
}: {
  entry: LibraryEntry;
  setup: ChannelSetup[];
  preferredProjectId: number | null;
  /** null while there is no map to save */
  capture: () => ViewCapture | string;
  marks: BenchMark[];
  fromView?: ViewOnBench;
  onSaved: () => void;
}) {
  const { data: me } = useMe();
  // the version of the view the Bench was opened from, moved on by each save into it
  const [fromVersion, setFromVersion] = useState(fromView?.view.version ?? 0);
  const { data: projects, isPending, error } = useProjects();
  const saveNew = useSaveNewView();
  const saveInto = useSaveViewChanges();
  const [title, setTitle] = useState('');
  const [chosen, setChosen] = useState<number | null>(null);
  const [outcome, setOutcome] = useState<Outcome | null>(null);

  if (isPending) return <p className="text-sm text-mist-500">Loading your projects…</p>;
  if (error) return <Notice tone="error">{error.message}</Notice>;
  const eligible = projects.filter((p) => !p.archived && (p.role === 'engineer' || p.role === 'lead'));
  if (eligible.length === 0) {
    return <p className="text-sm text-mist-500">You are not an engineer or lead in any open project, so you cannot save views yet.</p>;
  }
  const preferred = eligible.find((p) => p.id === preferredProjectId);
  const fromRole = fromView ? projects.find((p) => p.id === fromView.view.projectId)?.role : undefined;
  const mayUpdate =
    fromView !== undefined && !fromView.view.archived && (fromRole === 'lead' || (fromRole === 'engineer' && fromView.view.author?.id === me?.id));
  const projectId = chosen ?? preferred?.id ?? eligible[0].id;
  const project = eligible.find((p) => p.id === projectId)!;

  /** What is on screen now (its snapshot header checked by the capture); null, with the reason shown, if there is none. */
  const take = (): { taken: ViewCapture; header: ViewCapture['header'] } | null => {
    setOutcome(null);
    const taken = capture();
    if (typeof taken === 'string') {
      setOutcome({ tone: 'error', message: taken });
      return null;
    }
    return { taken, header: taken.header };
  };


  const busy = saveNew.isPending || saveInto.isPending;
  /** Runs a save and reports; `refused` words the server's refusals the engineer can act on. */
  const save = async (write: () => Promise<ViewDetail>, refused: (e: ApiError) => string | null) => {
    try {
      const view = await write();
      setOutcome({ tone: 'ok', viewId: view.id, title: view.title });
      onSaved();
    } catch (err) {
      setOutcome({ tone: 'error', message: (err instanceof ApiError ? refused(err) : null) ?? errorMessage(err) });
    }
  };

  const pendingMarks = (swapped: boolean) => marks.map((m) => markBody(m, swapped));

  const onSubmit = async (e: FormEvent) => {
    e.preventDefault();
    const now = take();
    if (!now) return;
    // The same check the server makes, before anything is sent.
    const draft = createViewBody.safeParse({ title, recordingId: 1, state: now.taken.state });
    if (!draft.success) {
      setOutcome({ tone: 'error', message: issuesText(draft.error.issues) });
      return;
    }
    await save(
      () =>
        saveNew.mutateAsync({
          project,
          entry,
          setup,
          setupProblems: setupProblems(setup),
          title,
          state: now.taken.state,
          marks: pendingMarks(now.taken.swapped),
          picture: { header: now.header, map: now.taken.map },
        }),
      (err) => (err.status === 403 ? `Only the engineers and leads of ${project.name} can save views in it.` : null),
    );
  };

  const saveChanges = async () => {
    if (!fromView) return;
    const now = take();
    if (!now) return;
    const saved = fromView.restore;
    // The view's marks sit in its axes: a save that turned or swapped them would misplace every one.
    const against = (now.taken.state as { processing?: { against?: string } }).processing?.against;
    if (now.taken.swapped !== saved.swapped || against !== saved.against) {
      setOutcome({
        tone: 'error',
        message: `The view's marks were placed on the map against ${saved.against}${saved.swapped ? ' with the axes swapped' : ''}; show it that way to save into the view, or save a new view.`,
      });
      return;
    }
    const body = saveViewChangesBody.safeParse({
      version: fromVersion,
      ...(title.trim() ? { title } : {}),
      state: now.taken.state,
      marks: pendingMarks(now.taken.swapped),
    });
    if (!body.success) {
      setOutcome({ tone: 'error', message: issuesText(body.error.issues) });
      return;
    }
    await save(
      async () => {
        const view = await saveInto.mutateAsync({ viewId: fromView.view.id, body: body.data, picture: { header: now.header, map: now.taken.map } });
        setFromVersion(view.version);
        return view;
      },
      (err) =>
        err.status === 409 ? 'Someone saved this view since you opened it here. Open it again from its page to see their changes, or save a new view.' : null,
    );
  };

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-label="Save view">
      <TextField label="View title" value={title} maxLength={191} onChange={(e) => setTitle(e.target.value)} placeholder="What does this view show?" />
      <div className="flex flex-wrap items-end gap-3">
        <SelectField
          label="Save into project"
          className="min-w-48 flex-1"
          value={projectId}
          onChange={(e) => {
            setChosen(Number(e.target.value));
            setOutcome(null);
          }}
        >
          {eligible.map((p) => (
            <option key={p.id} value={p.id}>
              {p.name}
            </option>
          ))}
        </SelectField>
        <Button type="submit" disabled={busy}>
          {busy ? 'Saving…' : fromView ? 'Save as a new view' : 'Save view'}
        </Button>
      </div>
      {fromView && mayUpdate && (
        <div className="flex flex-wrap items-center gap-3 border-t border-ink-800 pt-3">
          <Button type="button" variant="quiet" disabled={busy} onClick={() => void saveChanges()}>
            Save changes to “{fromView.view.title}”
          </Button>
          <span className="text-xs text-mist-500">Replaces its settings and picture{title.trim() ? ' and its title' : ''}; its marks and threads stay.</span>
        </div>
      )}
      <SaveOutcome outcome={outcome} />
      <p className="text-xs text-mist-500">
        Saves the settings, the visible window, the guides and {marks.length === 0 ? 'the marks you place (none yet)' : marks.length === 1 ? 'the pending mark' : `the ${marks.length} pending marks`} with a small picture of
        the map. The recording is registered with the project first if it is not yet.
      </p>
    </form>
  );
}
