import type { RouteObject } from 'react-router-dom';
import { paths } from '@/config/paths';

/** Settings → Dynos (owner manages; other staff may look). */
export const dynoRoutes: RouteObject[] = [
  { path: paths.dynos, lazy: () => import('./pages/dynos-page').then((m) => ({ Component: m.DynosPage })) },
];
