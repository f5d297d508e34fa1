import type { RouteObject } from 'react-router-dom';
import { paths } from '@/config/paths';

/** Signed-in routes of the comparisons feature (`/comparisons/new` before `/comparisons/:id`). */
export const comparisonRoutes: RouteObject[] = [
  { path: paths.comparisons, lazy: async () => ({ Component: (await import('./pages/comparisons-page')).default }) },
  { path: paths.newComparison, lazy: async () => ({ Component: (await import('./pages/comparison-builder-page')).default }) },
  { path: paths.comparison(), lazy: async () => ({ Component: (await import('./pages/comparison-page')).default }) },
];
