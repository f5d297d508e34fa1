import type { RouteObject } from 'react-router-dom';

/** Signed-in routes of the runs feature. */
export const runRoutes: RouteObject[] = [];
