import type { RouteObject } from 'react-router-dom';
import { paths } from '@/config/paths';

/** Signed-in routes of the runs feature (pages load on first visit). */
export const runRoutes: RouteObject[] = [
  { path: paths.upload, lazy: () => import('./pages/upload-page').then((m) => ({ Component: m.UploadPage })) },
  { path: paths.runs, lazy: () => import('./pages/run-list-page').then((m) => ({ Component: m.RunListPage })) },
  { path: paths.run(), lazy: () => import('./pages/run-page').then((m) => ({ Component: m.RunPage })) },
  { path: paths.session(), lazy: () => import('./pages/session-page').then((m) => ({ Component: m.SessionPage })) },
];
