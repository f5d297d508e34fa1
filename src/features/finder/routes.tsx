import { Outlet, type RouteObject } from 'react-router-dom';
import { STAFF } from '@shared/roles';
import { RequireRole } from '@/lib/auth';
import { paths } from '@/config/paths';

/**
 * Signed-in routes of the finder feature: shop staff only (every finder route answers 403 to
 * customers). The guard is a layout route, so a customer who types the address is told plainly.
 */
export const finderRoutes: RouteObject[] = [
  {
    element: (
      <RequireRole roles={STAFF}>
        <Outlet />
      </RequireRole>
    ),
    children: [{ path: paths.finder, lazy: async () => ({ Component: (await import('./pages/finder-page')).default }) }],
  },
];
