/**
 * The app in a process of its own for benches that must not share the load generator's CPU time
 * or event loop: `node --import tsx bench/lib/app-child.ts` with DATABASE_URL (and optionally
 * POOL_MAX) in the environment. Prints `READY <base url>` once listening; stops on SIGTERM.
 */
import { startBenchApp } from './app-server.js';

const app = await startBenchApp({ databaseUrl: process.env.DATABASE_URL!, poolMax: Number(process.env.POOL_MAX ?? 20) });
process.stdout.write(`READY ${app.baseUrl}\n`);
process.once('SIGTERM', () => {
  void app.close().then(() => process.exit(0));
});
