/**
 * Production entry: everything comes from the environment (managed PostgreSQL, S3, SMTP).
 * `node --import tsx server/index.ts`. Locally, `npm start` (scripts/start.ts) starts the
 * fakes first and then calls the same startServer.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ConfigError, loadConfig } from './config/env';
import { startServer } from './main';
import { logger } from './lib/logger';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));

try {
  const config = loadConfig();
  const server = await startServer(config, { clientDir: path.join(root, 'dist') });
  logger.info({ url: server.url }, 'listening');
  const stop = async (signal: string) => {
    logger.info({ signal }, 'shutting down');
    await server.close();
    process.exit(0);
  };
  process.once('SIGINT', () => void stop('SIGINT'));
  process.once('SIGTERM', () => void stop('SIGTERM'));
} catch (err) {
  if (err instanceof ConfigError) {
    logger.fatal(err.message);
    process.exit(2);
  }
  throw err;
}
