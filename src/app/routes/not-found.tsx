import { Link } from 'react-router-dom';
import { paths } from '../../config/paths';

export function NotFoundPage() {
  return (
    <div className="mx-auto max-w-xl px-6 py-16 text-center">
      <h1 className="mb-2 text-xl font-semibold">Nothing here</h1>
      <p className="mb-6 text-sm text-mist-500">This address does not lead to a page of Fanlight.</p>
      <Link to={paths.projects} className="text-accent hover:underline">
        Back to your projects
      </Link>
    </div>
  );
}
