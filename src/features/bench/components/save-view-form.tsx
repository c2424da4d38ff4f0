import { useQueryClient } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import { registerRecordingBody } from '../../../../server/schemas/recordings';
import { createViewBody, saveViewBody, saveViewChangesBody, type ViewDetail } from '../../../../server/schemas/views';
import { SNAPSHOT_CONTENT_TYPE, snapshotHeader, type SnapshotHeader } from '../../../../workers/io/snapshot-format';
import { encodeSnapshot } from '../../../../workers/io/snapshot-codec';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { linkClass } from '../../../components/ui/styles';
import { paths } from '../../../config/paths';
import { api, ApiError } from '../../../lib/api-client';
import { useMe } from '../../auth/api/auth';
import { useProjects } from '../../projects/api/projects';
import { projectRecordingsQuery, useRegisterRecording } from '../../projects/api/recordings';
import { viewKeys } from '../../views/api/keys';
import type { LibraryEntry } from '../../library/library-store';
import type { ViewOnBench } from '../view-state/view-restore';
import { markBody, type BenchMark } from '../view-state/view-snapshot';
import { setupProblems } from './register-form';

/** What the workbench hands over when the view is saved: taken at that moment from what is on screen. */
export interface ViewCapture {
  state: unknown;
  header: SnapshotHeader;
  map: Uint8Array;
  swapped: boolean;
}

type Outcome = { tone: 'ok'; viewId: number; title: string } | { tone: 'error'; message: string };

/** The multipart body of a whole save: the view (with its marks) as JSON, and the snapshot file. */
function wholeView(view: unknown, snapshot: Uint8Array): FormData {
  const form = new FormData();
  form.append('view', JSON.stringify(view));
  form.append('snapshot', new Blob([snapshot.slice()], { type: SNAPSHOT_CONTENT_TYPE }), 'map.fls');
  return form;
}

const issuesText = (issues: { path: PropertyKey[]; message: string }[]) =>
  issues
    .slice(0, 4)
    .map((i) => (i.path.length ? `${i.path.map(String).join('.')}: ${i.message}` : i.message))
    .join(' ');

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
  const qc = useQueryClient();
  const { data: me } = useMe();
  // the version of the view the Bench was opened from, moved on by each save into it
  const [fromVersion, setFromVersion] = useState(fromView?.view.version ?? 0);
  const { data: projects, isPending, error } = useProjects();
  const register = useRegisterRecording();
  const [title, setTitle] = useState('');
  const [chosen, setChosen] = useState<number | null>(null);
  const [busy, setBusy] = useState(false);
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

  const recordingIdIn = async (pid: number): Promise<number> => {
    const known = await qc.fetchQuery(projectRecordingsQuery(pid));
    const found = known.find((r) => r.fingerprint === entry.fingerprint);
    if (found) return found.id;
    const problems = setupProblems(setup);
    if (problems.length > 0) throw new Error(`The recording must be registered with ${project.name} first; fix the channel setup. ${problems.join(' ')}`);
    const body = registerRecordingBody.safeParse({
      name: entry.name,
      fingerprint: entry.fingerprint,
      format: entry.format,
      sampleRateHz: entry.sampleRateHz,
      durationS: entry.durationS,
      channels: setup.map(({ index, name, quantity, unit, calibration }) => ({ index, name, quantity, unit, calibration })),
    });
    if (!body.success) throw new Error(issuesText(body.error.issues));
    return (await register.mutateAsync({ projectId: pid, body: body.data })).recording.id;
  };

  /** What is on screen now, with its snapshot header checked; null (and the reason shown) if there is none. */
  const take = (): { taken: ViewCapture; header: SnapshotHeader } | null => {
    setOutcome(null);
    const taken = capture();
    if (typeof taken === 'string') {
      setOutcome({ tone: 'error', message: taken });
      return null;
    }
    const header = snapshotHeader.safeParse(taken.header);
    if (!header.success) {
      setOutcome({ tone: 'error', message: `The snapshot cannot be made: ${issuesText(header.error.issues)}` });
      return null;
    }
    return { taken, header: header.data };
  };

  /** Runs a save (view, snapshot and pending marks in one request) and reports. */
  const save = async (writeView: () => Promise<ViewDetail>, refused: (e: ApiError) => string | null) => {
    setBusy(true);
    try {
      const view = await writeView();
      await qc.invalidateQueries({ queryKey: viewKeys.all });
      setOutcome({ tone: 'ok', viewId: view.id, title: view.title });
      onSaved();
    } catch (err) {
      const message = (err instanceof ApiError ? refused(err) : null) ?? (err instanceof Error ? err.message : String(err));
      setOutcome({ tone: 'error', message });
    } finally {
      setBusy(false);
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
      async () => {
        const recordingId = await recordingIdIn(project.id);
        const body = saveViewBody.parse({ title, recordingId, state: now.taken.state, marks: pendingMarks(now.taken.swapped) });
        const form = wholeView(body, encodeSnapshot(now.header, now.taken.map));
        return (await api.sendForm<{ view: ViewDetail }>('POST', `/projects/${project.id}/views`, form)).view;
      },
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
        const form = wholeView(body.data, encodeSnapshot(now.header, now.taken.map));
        const { view } = await api.sendForm<{ view: ViewDetail }>('PATCH', `/views/${fromView.view.id}`, form);
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
      {outcome?.tone === 'error' && <Notice tone="error">{outcome.message}</Notice>}
      {outcome?.tone === 'ok' && (
        <Notice tone="ok">
          Saved as{' '}
          <Link to={paths.view(outcome.viewId)} className={linkClass} data-testid="saved-view-link">
            {outcome.title}
          </Link>
        </Notice>
      )}
      <p className="text-xs text-mist-500">
        Saves the settings, the visible window, the guides and {marks.length === 0 ? 'the marks you place (none yet)' : marks.length === 1 ? 'the pending mark' : `the ${marks.length} pending marks`} with a small picture of
        the map. The recording is registered with the project first if it is not yet.
      </p>
    </form>
  );
}
