import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { LoadingState } from '@/components/ui';
import { useAuth } from '@/lib/auth';
import { paths } from '@/config/paths';

/** Sends signed-out visitors to the sign-in page, remembering where they were going. */
export function RequireAuth() {
  const { user, isLoading } = useAuth();
  const location = useLocation();
  if (isLoading) return <LoadingState message="Checking your sign-in…" />;
  if (!user) return <Navigate to={`${paths.login}?next=${encodeURIComponent(location.pathname + location.search)}`} replace />;
  return <Outlet />;
}
