import type { RouteObject } from 'react-router-dom';

/** Signed-in routes of the comparisons feature. */
export const comparisonRoutes: RouteObject[] = [];
