/** The auth feature's public face: its routes (see routes.tsx). Nothing else is shared yet. */
export { authRoutes, accountRoutes } from './routes';
