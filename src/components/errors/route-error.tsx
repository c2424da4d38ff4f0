import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { paths } from '../../config/paths';
import { errorMessage } from '../../lib/error-message';
import { Notice } from '../ui/notice';
import { linkClass } from '../ui/styles';

/** The router's errorElement: a page that failed to render says so, with a way back, instead of a blank tab. */
export function RouteError() {
  const error = useRouteError();
  const text = isRouteErrorResponse(error) ? `${error.status} ${error.statusText}` : errorMessage(error);
  return (
    <div className="mx-auto flex max-w-xl flex-col gap-3 px-6 py-10">
      <h1 className="text-lg font-semibold text-mist-100">This page ran into a problem</h1>
      <Notice tone="error">{text}</Notice>
      <p className="text-sm text-mist-400">
        Nothing you saved is lost.{' '}
        <button type="button" className={linkClass} onClick={() => window.location.reload()}>
          Reload the page
        </button>{' '}
        or go back to{' '}
        <Link className={linkClass} to={paths.projects}>
          your projects
        </Link>
        .
      </p>
    </div>
  );
}
