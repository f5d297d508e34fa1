/** The customers feature's public face. */
export { customerRoutes } from './routes';
export { customerQueries } from './api/customer-queries';
