import type { RouteObject } from 'react-router-dom';
import { STAFF } from '@shared/roles';
import { RequireRole } from '@/lib/auth';
import { paths } from '@/config/paths';

/** The inbox: files from a dyno with nothing on it, for staff to assign. */
export const inboxRoutes: RouteObject[] = [
  {
    path: paths.inbox,
    lazy: () =>
      import('./pages/inbox-page').then(({ InboxPage }) => ({
        element: (
          <RequireRole roles={STAFF}>
            <InboxPage />
          </RequireRole>
        ),
      })),
  },
];
