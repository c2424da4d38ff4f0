import { Link } from 'react-router-dom';
import { paths } from '../../config/paths';
import { useMe } from '../../features/auth/api/auth';
import { useProjects } from '../../features/projects/api/projects';
import { CreateProjectForm } from '../../features/projects/components/create-project-form';
import { Notice } from '../../components/ui/notice';
import { formatDateTime } from '../../lib/format';

export function ProjectsPage() {
  const { data: projects, isPending, error } = useProjects();
  const { data: me } = useMe();
  // The server allows staff and admins to create projects; guests are invited into them.
  const mayCreate = me?.siteRole === 'staff' || me?.siteRole === 'admin';
  return (
    <div className="mx-auto max-w-5xl px-6 py-8">
      <h1 className="mb-6 text-xl font-semibold">Projects</h1>
      {isPending && <p className="text-sm text-mist-500">Loading projects…</p>}
      {error && <Notice tone="error">{error.message}</Notice>}
      {projects && projects.length === 0 && (
        <p className="rounded-lg border border-dashed border-ink-700 px-6 py-10 text-center text-sm text-mist-500">
          You are not a member of any project yet. A project lead can invite you.
        </p>
      )}
      {projects && projects.length > 0 && (
        <table className="w-full border-collapse text-sm" data-testid="projects-table">
          <thead>
            <tr className="border-b border-ink-700 text-left text-xs uppercase tracking-wider text-mist-500">
              <th className="py-2 pr-4 font-medium">Name</th>
              <th className="py-2 pr-4 font-medium">Your role</th>
              <th className="py-2 pr-4 text-right font-medium">Recordings</th>
              <th className="py-2 pr-4 text-right font-medium">Views</th>
              <th className="py-2 font-medium">Last activity</th>
            </tr>
          </thead>
          <tbody>
            {projects.map((p) => (
              <tr key={p.id} className="border-b border-ink-800 hover:bg-ink-900">
                <td className="py-2.5 pr-4">
                  <Link to={paths.project(p.id)} className="font-medium text-mist-100 hover:text-accent">
                    {p.name}
                  </Link>
                  {p.archived && <span className="ml-2 text-xs text-mist-500">archived</span>}
                </td>
                <td className="py-2.5 pr-4 text-mist-300">{p.role}</td>
                <td className="py-2.5 pr-4 text-right font-mono">{p.recordingCount}</td>
                <td className="py-2.5 pr-4 text-right font-mono">{p.viewCount}</td>
                <td className="py-2.5 font-mono text-xs text-mist-300">{formatDateTime(p.lastActivityAt)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {mayCreate && (
        <div className="mt-10 max-w-xl">
          <CreateProjectForm />
        </div>
      )}
    </div>
  );
}
