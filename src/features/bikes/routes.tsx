import type { RouteObject } from 'react-router-dom';
import { paths } from '@/config/paths';

/** Bike list, and the bike page — a screen other features add sections to, so it lives in src/app/routes. */
export const bikeRoutes: RouteObject[] = [
  { path: paths.bikes, lazy: async () => ({ Component: (await import('./pages/bikes-page')).default }) },
  { path: paths.bike(), lazy: async () => ({ Component: (await import('@/app/routes/bike-page')).BikePage }) },
];
