/** What the inbox feature offers the app: its route. */
export { inboxRoutes } from './routes';
