import type { RouteObject } from 'react-router-dom';

/** Signed-in routes of the finder feature. */
export const finderRoutes: RouteObject[] = [];
