import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { useMe } from '../../features/auth/api/auth';
import { paths } from '../../config/paths';

/** Guards the signed-in part of the app: without a session the user is sent to Sign in and back after. */
export function RequireSignIn() {
  const { data: me, isPending, error } = useMe();
  const location = useLocation();
  if (isPending) return <div className="p-8 text-sm text-mist-500">Loading…</div>;
  if (error) return <div className="p-8 text-sm text-danger">{error.message}</div>;
  if (!me) {
    const next = encodeURIComponent(location.pathname + location.search);
    return <Navigate to={`${paths.signIn}?next=${next}`} replace />;
  }
  return <Outlet />;
}
