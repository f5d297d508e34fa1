import type { ReactNode } from 'react';
import type { RouteObject } from 'react-router-dom';
import { STAFF } from '@shared/roles';
import { RequireRole } from '@/lib/auth';
import { paths } from '@/config/paths';

/** What the app layer adds to comparison screens (other features' parts, composed in src/app). */
export interface ComparisonExtras {
  /** Rendered on a saved comparison's page for staff, e.g. the reports feature's "Make gain report". */
  savedComparisonActions?: (comparisonId: string) => ReactNode;
}

/** Signed-in routes of the comparisons feature (`/comparisons/new` before `/comparisons/:id`). */
export function comparisonRoutes(extras: ComparisonExtras = {}): RouteObject[] {
  return [
    { path: paths.comparisons, lazy: async () => ({ Component: (await import('./pages/comparisons-page')).default }) },
    {
      // The builder asks staff-only endpoints: a customer who types the address is told plainly.
      path: paths.newComparison,
      lazy: async () => {
        const ComparisonBuilderPage = (await import('./pages/comparison-builder-page')).default;
        return {
          element: (
            <RequireRole roles={STAFF}>
              <ComparisonBuilderPage />
            </RequireRole>
          ),
        };
      },
    },
    {
      path: paths.comparison(),
      lazy: async () => {
        const ComparisonPage = (await import('./pages/comparison-page')).default;
        return { Component: () => <ComparisonPage actions={extras.savedComparisonActions} /> };
      },
    },
  ];
}
