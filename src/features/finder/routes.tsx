import { lazy } from 'react';
import type { RouteObject } from 'react-router-dom';
import { paths } from '@/config/paths';

const FinderPage = lazy(() => import('./pages/FinderPage'));

/** Signed-in routes of the finder feature. */
export const finderRoutes: RouteObject[] = [{ path: paths.finder, element: <FinderPage /> }];
