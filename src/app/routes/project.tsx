import { useMemo } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Notice } from '../../components/ui/notice';
import { linkClass } from '../../components/ui/styles';
import { paths } from '../../config/paths';
import { useProject } from '../../features/projects/api/projects';
import { CampaignsSection } from '../../features/campaigns/components/campaigns-section';
import { ActivityList } from '../../features/projects/components/activity-list';
import { MembersSection } from '../../features/projects/components/members-section';
import { ProjectHeader } from '../../features/projects/components/project-header';
import { RecordingsSection } from '../../features/projects/components/recordings-section';
import { TargetsSection } from '../../features/projects/components/targets-section';
import { useViewCountsByRecording } from '../../features/views/api/views';
import { ViewsSection } from '../../features/views/components/views-section';
import { ApiError } from '../../lib/api-client';
import { useDemoRecordings } from '../../features/bench/api/demo-recordings';

export function ProjectPage() {
  const raw = useParams().id ?? '';
  const id = /^[1-9]\d*$/.test(raw) ? Number(raw) : null;
  if (id === null) return <ProjectNotFound />;
  return <Project id={id} />;
}

function Project({ id }: { id: number }) {
  const { data: project, isPending, error } = useProject(id);
  const { data: viewCounts } = useViewCountsByRecording(id);
  const { data: demos } = useDemoRecordings();
  const demoFiles = useMemo(() => new Set((demos ?? []).map((d) => d.file)), [demos]);
  if (isPending) return <p className="px-6 py-8 text-sm text-mist-500">Loading the project…</p>;
  // The server answers 404 for projects one is not a member of, as for those that do not exist.
  if (error instanceof ApiError && error.status === 404) return <ProjectNotFound />;
  if (error) {
    return (
      <div className="mx-auto max-w-6xl px-6 py-8">
        <Notice tone="error">{error.message}</Notice>
      </div>
    );
  }
  return (
    <div className="mx-auto max-w-6xl px-6 py-8">
      <ProjectHeader project={project} />
      <div className="flex flex-col gap-6">
        <ViewsSection projectId={id} isLead={project.role === 'lead'} />
        <RecordingsSection projectId={id} viewCounts={viewCounts} demoFiles={demoFiles} />
        <TargetsSection projectId={id} mayEdit={!project.archived && (project.role === 'engineer' || project.role === 'lead')} />
        <CampaignsSection projectId={id} />
      </div>
      <div className="mt-6 grid items-start gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <MembersSection projectId={id} isLead={project.role === 'lead'} />
        <ActivityList projectId={id} />
      </div>
    </div>
  );
}

function ProjectNotFound() {
  return (
    <div className="mx-auto max-w-xl px-6 py-16 text-center">
      <h1 className="mb-2 text-xl font-semibold">Project not found</h1>
      <p className="mb-6 text-sm text-mist-500">It does not exist, or you are not a member of it.</p>
      <Link to={paths.projects} className={linkClass}>
        Back to your projects
      </Link>
    </div>
  );
}
