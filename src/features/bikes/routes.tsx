import { Outlet, type RouteObject } from 'react-router-dom';
import { STAFF } from '@shared/roles';
import { RequireRole } from '@/lib/auth';
import { paths } from '@/config/paths';

/**
 * The bike list (shop staff; customers see their bikes on "My bikes"), and the bike page for
 * everyone who may see that bike — a screen other features add sections to, so it lives in src/app/routes.
 */
export const bikeRoutes: RouteObject[] = [
  {
    element: (
      <RequireRole roles={STAFF}>
        <Outlet />
      </RequireRole>
    ),
    children: [{ path: paths.bikes, lazy: async () => ({ Component: (await import('./pages/bikes-page')).default }) }],
  },
  { path: paths.bike(), lazy: async () => ({ Component: (await import('@/app/routes/bike-page')).BikePage }) },
];
