import { useState } from 'react';
import type { ProjectDetail } from '../../../../server/schemas/projects';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { formatDateTime } from '../../../lib/format';
import { useSetArchived } from '../api/projects';
import { EditProjectForm } from './edit-project-form';

export function ProjectHeader({ project }: { project: ProjectDetail }) {
  const isLead = project.role === 'lead';
  const [editing, setEditing] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const setArchived = useSetArchived(project.id);

  const toggleArchived = () => {
    setProblem(null);
    setArchived.mutate(!project.archived, { onError: (e) => setProblem(e.message) });
  };

  return (
    <header className="mb-8 flex flex-col gap-3">
      <div className="flex flex-wrap items-start gap-4">
        <div className="min-w-0 flex-1">
          <div className="flex flex-wrap items-center gap-3">
            <h1 className="break-words text-xl font-semibold">{project.name}</h1>
            {project.archived && (
              <span className="rounded border border-ink-600 px-1.5 py-0.5 text-xs text-mist-300">archived</span>
            )}
          </div>
          <p className="mt-1 text-sm text-mist-500">
            Your role: <span className="text-mist-300">{project.role}</span> · created{' '}
            <span className="font-mono text-xs">{formatDateTime(project.createdAt)}</span>
          </p>
        </div>
        {isLead && !editing && (
          <div className="flex gap-2">
            <Button type="button" variant="quiet" onClick={() => setEditing(true)}>
              Edit
            </Button>
            <Button
              type="button"
              variant={project.archived ? 'quiet' : 'danger'}
              disabled={setArchived.isPending}
              onClick={toggleArchived}
            >
              {project.archived ? 'Restore project' : 'Archive project'}
            </Button>
          </div>
        )}
      </div>
      {problem && <Notice tone="error">{problem}</Notice>}
      {editing ? (
        <EditProjectForm project={project} onDone={() => setEditing(false)} />
      ) : (
        project.description && (
          <p className="max-w-3xl whitespace-pre-line text-sm text-mist-300">{project.description}</p>
        )
      )}
    </header>
  );
}
