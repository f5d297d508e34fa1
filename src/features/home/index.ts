/** The home feature's public face. */
export { homeRoutes } from './routes';
