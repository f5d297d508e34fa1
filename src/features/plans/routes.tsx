import type { RouteObject } from 'react-router-dom';
import { paths } from '@/config/paths';

/** Signed-in routes of the plans feature (staff and the bike's customer). */
export const planRoutes: RouteObject[] = [{ path: paths.plan(), lazy: async () => ({ Component: (await import('./pages/plan-page')).default }) }];

/** Public routes: a plan opened from its link; rendered without the app shell. */
export const publicPlanRoutes: RouteObject[] = [{ path: paths.planLink(), lazy: async () => ({ Component: (await import('./pages/plan-link-page')).default }) }];
