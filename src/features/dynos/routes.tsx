import type { RouteObject } from 'react-router-dom';
import { RequireRole } from '@/lib/auth';
import { paths } from '@/config/paths';

/** Settings → Dynos: the owner's page (the session form reads the dyno list through the API). */
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
];
