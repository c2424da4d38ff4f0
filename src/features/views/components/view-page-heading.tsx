import { Link } from 'react-router-dom';
import type { ViewDetail } from '../../../../server/schemas/views';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { paths } from '../../../config/paths';
import { formatDateTime } from '../../../lib/format';
import { useArchiveView } from '../api/views';
import { ViewHeading } from './view-heading';

/** The view's title and facts, the lead's archive button, and what archiving means. */
export function ViewPageHeading({ view, projectName, isLead }: { view: ViewDetail; projectName: string | null; isLead: boolean }) {
  const archive = useArchiveView();
  return (
    <>
      <ViewHeading
        kicker={
          <Link to={paths.project(view.projectId)} className="hover:text-mist-100">
            ← {projectName ?? 'Project'}
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
      {archive.error && <Notice tone="error">{archive.error.message}</Notice>}
      {view.archived && (
        <div className="mb-6">
          <Notice>This view is archived: it can be read, but takes no new marks or replies.</Notice>
        </div>
      )}
    </>
    );
}
