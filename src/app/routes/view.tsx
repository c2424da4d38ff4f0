import { Link, useParams } from 'react-router-dom';
import { ErrorBoundary } from '../../components/errors/error-boundary';
import { Notice } from '../../components/ui/notice';
import { linkClass } from '../../components/ui/styles';
import { paths } from '../../config/paths';
import { useView } from '../../features/views/api/views';
import { LoadedView } from '../../features/views/components/loaded-view';
import { ApiError } from '../../lib/api-client';

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
