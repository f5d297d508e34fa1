import type { RouteObject } from 'react-router-dom';

/** The start page ("/"): Today for staff, My bikes for customers. */
export const homeRoutes: RouteObject[] = [{ index: true, lazy: async () => ({ Component: (await import('./pages/home-page')).default }) }];
