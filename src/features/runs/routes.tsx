import type { RouteObject } from 'react-router-dom';
import { STAFF, WORKSHOP } from '@shared/roles';
import { RequireRole } from '@/lib/auth';
import { paths } from '@/config/paths';

/**
 * Signed-in routes of the runs feature (pages load on first visit). Staff screens are wrapped in
 * RequireRole, so a customer who opens one by URL gets a plain page instead of requests that 403.
 * The run page itself stays open to customers: the server shows them their own bikes' runs.
 */
export const runRoutes: RouteObject[] = [
  {
    path: paths.upload,
    lazy: () =>
      import('./pages/upload-page').then(({ UploadPage }) => ({
        element: (
          <RequireRole roles={WORKSHOP}>
            <UploadPage />
          </RequireRole>
        ),
      })),
  },
  {
    path: paths.runs,
    lazy: () =>
      import('./pages/run-list-page').then(({ RunListPage }) => ({
        element: (
          <RequireRole roles={STAFF}>
            <RunListPage />
          </RequireRole>
        ),
      })),
  },
  { path: paths.run(), lazy: () => import('./pages/run-page').then((m) => ({ Component: m.RunPage })) },
  {
    path: paths.session(),
    lazy: () =>
      import('./pages/session-page').then(({ SessionPage }) => ({
        element: (
          <RequireRole roles={STAFF}>
            <SessionPage />
          </RequireRole>
        ),
      })),
  },
];
