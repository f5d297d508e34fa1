import type { RouteObject } from 'react-router-dom';
import { paths } from '@/config/paths';

/** Signed-in routes of the reports feature. */
export const reportRoutes: RouteObject[] = [
  { path: paths.reports, lazy: async () => ({ Component: (await import('./pages/reports-page')).default }) },
  { path: paths.report(), lazy: async () => ({ Component: (await import('./pages/report-page')).default }) },
];

/** Public routes of the reports feature (the share-link page); rendered without the app shell. */
export const publicReportRoutes: RouteObject[] = [{ path: paths.share(), lazy: async () => ({ Component: (await import('./pages/share-page')).default }) }];
