/** What the dynos feature offers the app: its settings route. */
export { dynoRoutes } from './routes';
