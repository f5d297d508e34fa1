/** The admin feature's public face. */
export { adminRoutes } from './routes';
