import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import type { Mark, ViewDetail } from '../../../server/schemas/views';
import { ErrorBoundary } from '../../components/errors/error-boundary';
import { Button } from '../../components/ui/button';
import { Notice } from '../../components/ui/notice';
import { Section } from '../../components/ui/section';
import { linkClass } from '../../components/ui/styles';
import { benchFor, paths } from '../../config/paths';
import { useMe } from '../../features/auth/api/auth';
import { useDemoRecordings } from '../../features/bench/api/demo-recordings';
import { membersQuery } from '../../features/projects/api/members';
import { projectQuery } from '../../features/projects/api/projects';
import { projectRecordingsQuery } from '../../features/projects/api/recordings';
import { useInLocalLibrary } from '../../features/views/api/local-library';
import { useCreateMark, useMarks } from '../../features/views/api/marks';
import { useSnapshot } from '../../features/views/api/snapshot';
import { useArchiveView, useView } from '../../features/views/api/views';
import { EditableMarkBody } from '../../features/views/components/mark-editor';
import { MarkThread, ViewThread } from '../../features/views/components/member-threads';
import { PlaceMarkForm } from '../../features/views/components/place-mark-form';
import { ReportButton } from '../../features/views/components/report-button';
import { SharePanel } from '../../features/views/components/share-panel';
import type { PendingPlace } from '../../features/views/components/snapshot-figure';
import { ViewHeading } from '../../features/views/components/view-heading';
import { ViewLayout } from '../../features/views/components/view-layout';
import type { AxisSpec } from '../../features/views/snapshot/axes';
import { ApiError } from '../../lib/api-client';
import { formatDateTime } from '../../lib/format';

export function ViewPage() {
  const raw = useParams().id ?? '';
  const id = /^[1-9]\d*$/.test(raw) ? Number(raw) : null;
  if (id === null) return <ViewNotFound />;
  return (
    <ErrorBoundary key={id} region="The view">
      <ViewScreen id={id} />
    </ErrorBoundary>
  );
}

function ViewScreen({ id }: { id: number }) {
  const { data: view, isPending, error } = useView(id);
  if (isPending) return <p className="px-6 py-8 text-sm text-mist-500">Loading the view…</p>;
  // 404 also for a view of a project one is not a member of
  if (error instanceof ApiError && error.status === 404) return <ViewNotFound />;
  if (error) {
    return (
      <div className="mx-auto max-w-6xl px-6 py-8">
        <Notice tone="error">{error.message}</Notice>
      </div>
    );
  }
  return <LoadedView view={view} />;
}

function LoadedView({ view }: { view: ViewDetail }) {
  const { data: me } = useMe();
  const project = useQuery(projectQuery(view.projectId));
  const role = project.data?.role ?? null;
  const isLead = role === 'lead';
  const isEngineer = role === 'engineer' || isLead;
  const open = !view.archived;

  const snapshot = useSnapshot(view.id, view.snapshot !== null);
  const marks = useMarks(view.id);
  const members = useQuery({ ...membersQuery(view.projectId), enabled: isEngineer });
  const recordings = useQuery({ ...projectRecordingsQuery(view.projectId), enabled: view.recordingId !== null });
  const recording = recordings.data?.find((r) => r.id === view.recordingId) ?? null;
  const fingerprint = recording?.fingerprint ?? null;
  const inLibrary = useInLocalLibrary(fingerprint);
  const demos = useDemoRecordings();
  const demoFile = recording && demos.data?.some((d) => d.file === recording.name) ? recording.name : null;
  const archive = useArchiveView();

  const [params, setParams] = useSearchParams();
  const selectedMarkId = Number(params.get('mark')) || null;
  const selectMark = (markId: number) =>
    setParams(
      (p) => {
        p.set('mark', String(markId));
        return p;
      },
      { replace: true, preventScrollReset: true },
    );

  // The mark named in the address (a mail's link) comes into sight once the marks are there.
  const scrolled = useRef(false);
  useEffect(() => {
    if (scrolled.current || !marks.data || selectedMarkId === null) return;
    scrolled.current = true;
    document.getElementById(`mark-card-${selectedMarkId}`)?.scrollIntoView({ block: 'start' });
  }, [marks.data, selectedMarkId]);

  const [pending, setPending] = useState<PendingPlace | null>(null);
  const create = useCreateMark(view.id);
  const place = async (text: string) => {
    if (!pending) return;
    const mark: Mark = await create.mutateAsync({ ...pending, text });
    setPending(null);
    selectMark(mark.id);
  };

  const mayEdit = (m: Mark) => open && (isLead || (isEngineer && m.author?.id === me?.id));
  const axes = (snapshot.data?.header.axes ?? view.state.axes) as { x: AxisSpec; y: AxisSpec };

  const heading = (
    <ViewHeading
      kicker={
        <Link to={paths.project(view.projectId)} className="hover:text-mist-100">
          ← {project.data?.name ?? 'Project'}
        </Link>
      }
      title={view.title}
      archived={view.archived}
      facts={[
        { label: 'By', value: view.author?.name ?? 'someone no longer here' },
        { label: 'Recording', value: view.recordingName ?? 'not linked' },
        { label: 'Saved', value: <span className="font-mono text-xs">{formatDateTime(view.createdAt)}</span> },
        { label: 'Updated', value: <span className="font-mono text-xs">{formatDateTime(view.updatedAt)}</span> },
      ]}
      actions={
        isLead && (
          <Button
            type="button"
            variant={view.archived ? 'quiet' : 'danger'}
            disabled={archive.isPending}
            onClick={() => archive.mutate({ id: view.id, archived: !view.archived })}
          >
            {view.archived ? 'Restore view' : 'Archive view'}
          </Button>
        )
      }
    />
  );

  return (
    <ViewLayout
      heading={
        <>
          {heading}
          {archive.error && <Notice tone="error">{archive.error.message}</Notice>}
          {view.archived && (
            <div className="mb-6">
              <Notice>This view is archived: it can be read, but takes no new marks or replies.</Notice>
            </div>
          )}
        </>
      }
      state={view.state}
      snapshot={{ hasSnapshot: view.snapshot !== null, data: snapshot.data, isPending: snapshot.isPending, error: snapshot.error }}
      marks={marks.data}
      marksError={marks.error}
      selectedMarkId={selectedMarkId}
      onSelectMark={selectMark}
      markParts={(m, n, selected) => ({
        body: mayEdit(m) ? <EditableMarkBody viewId={view.id} mark={m} number={n} /> : undefined,
        thread: <MarkThread viewId={view.id} markId={m.id} mayReply={open} open={selected} onOpen={() => selectMark(m.id)} />,
      })}
      discussion={<ViewThread viewId={view.id} mayReply={open} />}
      placing={
        isEngineer && open
          ? {
              pending,
              onPick: setPending,
              form: <PlaceMarkForm pending={pending} axes={axes} onClear={() => setPending(null)} onPlace={place} />,
            }
          : undefined
      }
      aside={
        <>
          {isEngineer && (
            <SharePanel
              viewId={view.id}
              archived={view.archived}
              members={(members.data?.members ?? []).filter((m) => m.userId !== me?.id)}
            />
          )}
          <Section title="Report">
            <p className="mb-2 text-sm text-mist-300">A printable PDF of this view: settings, map with guides and marks, findings, tracks and threads.</p>
            <ReportButton
              view={view}
              projectName={project.data?.name ?? ''}
              recording={recording}
              snapshot={snapshot.data}
              marks={marks.data}
              me={me?.name ?? ''}
            />
          </Section>
          {fingerprint && (inLibrary.data || demoFile) && (
            <Section title="On the Bench">
              <p className="mb-2 text-sm text-mist-300">
                {inLibrary.data ? "This browser's library holds the recording of this view." : 'The recording of this view is one of the demo recordings.'}
              </p>
              <Link to={benchFor({ fingerprint, demoFile: inLibrary.data ? null : demoFile, viewId: view.id })} className={linkClass}>
                Open live on the Bench
              </Link>
            </Section>
          )}
        </>
      }
    />
  );
}

function ViewNotFound() {
  return (
    <div className="mx-auto max-w-xl px-6 py-16 text-center">
      <h1 className="mb-2 text-xl font-semibold">View not found</h1>
      <p className="mb-6 text-sm text-mist-500">It does not exist, or it belongs to a project you are not a member of.</p>
      <Link to={paths.projects} className={linkClass}>
        Back to your projects
      </Link>
    </div>
  );
}
