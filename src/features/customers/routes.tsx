import { Outlet, type RouteObject } from 'react-router-dom';
import { STAFF } from '@shared/roles';
import { RequireRole } from '@/lib/auth';
import { paths } from '@/config/paths';

/**
 * Customer list and customer page: shop staff only (the API refuses customers). The guard is a
 * layout route, so a customer who types the address is told plainly and no page code loads.
 */
export const customerRoutes: RouteObject[] = [
  {
    element: (
      <RequireRole roles={STAFF}>
        <Outlet />
      </RequireRole>
    ),
    children: [
      { path: paths.customers, lazy: async () => ({ Component: (await import('./pages/customers-page')).default }) },
      { path: paths.customer(), lazy: async () => ({ Component: (await import('./pages/customer-page')).default }) },
    ],
  },
];
