import type { RouteObject } from 'react-router-dom';

/** Signed-in routes of the reports feature. */
export const reportRoutes: RouteObject[] = [];

/** Public routes of the reports feature (the share-link page); rendered without the app shell. */
export const publicReportRoutes: RouteObject[] = [];
