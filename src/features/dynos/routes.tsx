import type { RouteObject } from 'react-router-dom';
import { STAFF } from '@shared/roles';
import { RequireRole } from '@/lib/auth';
import { paths } from '@/config/paths';

/** Settings → Dynos (the owner's page; the session form reads the dyno list through the API), and the bay boards (staff). */
export const dynoRoutes: RouteObject[] = [
  {
    path: paths.dynos,
    lazy: () =>
      import('./pages/dynos-page').then(({ DynosPage }) => ({
        element: (
          <RequireRole roles={['owner']}>
            <DynosPage />
          </RequireRole>
        ),
      })),
  },
  {
    path: paths.bay,
    lazy: () =>
      import('./pages/bay-index-page').then(({ BayIndexPage }) => ({
        element: (
          <RequireRole roles={STAFF}>
            <BayIndexPage />
          </RequireRole>
        ),
      })),
  },
  {
    path: paths.bayBoard(),
    lazy: () =>
      import('./pages/bay-board-page').then(({ BayBoardPage }) => ({
        element: (
          <RequireRole roles={STAFF}>
            <BayBoardPage />
          </RequireRole>
        ),
      })),
  },
];
