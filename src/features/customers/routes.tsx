import type { RouteObject } from 'react-router-dom';
import { paths } from '@/config/paths';

/** Customer list and customer page (staff; the API refuses customers). */
export const customerRoutes: RouteObject[] = [
  { path: paths.customers, lazy: async () => ({ Component: (await import('./pages/customers-page')).default }) },
  { path: paths.customer(), lazy: async () => ({ Component: (await import('./pages/customer-page')).default }) },
];
