/** What the dynos feature offers the app: its routes (settings, bay boards) and the bike page's "Put on dyno". */
export { dynoRoutes } from './routes';
export { PutOnDyno } from './components/put-on-dyno';
