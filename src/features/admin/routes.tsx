import { Outlet, type RouteObject } from 'react-router-dom';
import { paths } from '@/config/paths';
import { OwnerOnly } from './components/owner-only';

/**
 * The owner's settings. One guard for all of them (a layout route): anyone else who lands here
 * is told plainly that the page is the owner's, and no settings page code loads or asks the API.
 * OwnerOnly rather than RequireRole because its message names the owner, not "shop staff".
 */
export const adminRoutes: RouteObject[] = [
  {
    element: (
      <OwnerOnly>
        <Outlet />
      </OwnerOnly>
    ),
    children: [
      { path: paths.users, lazy: async () => ({ Component: (await import('./pages/users-page')).default }) },
      { path: paths.shopSettings, lazy: async () => ({ Component: (await import('./pages/shop-settings-page')).default }) },
      { path: paths.audit, lazy: async () => ({ Component: (await import('./pages/audit-page')).default }) },
      { path: paths.outbox, lazy: async () => ({ Component: (await import('./pages/outbox-page')).default }) },
    ],
  },
];
