import type { RouteObject } from 'react-router-dom';
import { paths } from '@/config/paths';

/** The owner's settings. Each page checks the role itself and tells anyone else plainly. */
export const adminRoutes: RouteObject[] = [
  { path: paths.users, lazy: async () => ({ Component: (await import('./pages/users-page')).default }) },
  { path: paths.shopSettings, lazy: async () => ({ Component: (await import('./pages/shop-settings-page')).default }) },
  { path: paths.audit, lazy: async () => ({ Component: (await import('./pages/audit-page')).default }) },
  { path: paths.outbox, lazy: async () => ({ Component: (await import('./pages/outbox-page')).default }) },
];
