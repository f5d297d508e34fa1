import { Suspense } from 'react';
import { createBrowserRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { LoadingState } from '@/components/ui';
import { AppShell } from './shell/AppShell';
import { RequireAuth } from './shell/RequireAuth';
import { NotFoundPage, RouteErrorPage } from './shell/RouteError';
import { authRoutes, accountRoutes } from '@/features/auth/routes';
import { homeRoutes } from '@/features/home/routes';
import { customerRoutes } from '@/features/customers/routes';
import { bikeRoutes } from '@/features/bikes/routes';
import { adminRoutes } from '@/features/admin/routes';
import { runRoutes } from '@/features/runs/routes';
import { dynoRoutes } from '@/features/dynos/routes';
import { inboxRoutes } from '@/features/inbox/routes';
import { comparisonRoutes } from '@/features/comparisons/routes';
import { publicReportRoutes, reportRoutes } from '@/features/reports/routes';
import { ComparisonReportActions, CustomerReportsList } from '@/features/reports';
import { finderRoutes } from '@/features/finder/routes';
import { planRoutes, publicPlanRoutes } from '@/features/plans/routes';

/**
 * Every screen. Each feature lists its own routes (components lazy-loaded inside them); this
 * file only decides which need a signed-in user and the app shell.
 */
const routes: RouteObject[] = [
  ...authRoutes,
  ...publicReportRoutes,
  ...publicPlanRoutes,
  {
    element: <RequireAuth />,
    errorElement: <RouteErrorPage />,
    children: [
      {
        element: <AppShell />,
        errorElement: <RouteErrorPage />,
        children: [...homeRoutes(<CustomerReportsList />), ...customerRoutes, ...bikeRoutes, ...runRoutes, ...comparisonRoutes({ savedComparisonActions: (id) => <ComparisonReportActions comparisonId={id} /> }), ...reportRoutes, ...finderRoutes, ...adminRoutes, ...planRoutes, ...dynoRoutes, ...inboxRoutes, ...accountRoutes, { path: '*', element: <NotFoundPage /> }],
      },
    ],
  },
];

/** Shown while a lazily loaded page is fetched on the first load (React Router's HydrateFallback). */
const hydrateFallback = <LoadingState message="Loading Pullbook…" />;
const router = createBrowserRouter(routes.map((r) => ({ hydrateFallbackElement: hydrateFallback, ...r })));

export function AppRouter() {
  return (
    <Suspense fallback={<LoadingState message="Loading Pullbook…" />}>
      <RouterProvider router={router} />
    </Suspense>
  );
}
