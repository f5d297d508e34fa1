import { defineConfig } from '@mikro-orm/postgresql';
import { Migrator } from '@mikro-orm/migrations';
import { fileURLToPath } from 'node:url';
import { entities } from './entities';

const migrationsDir = fileURLToPath(new URL('../../migrations', import.meta.url));

/** ORM options for a database URL. Entities are EntitySchema objects, so no decorator metadata is needed. */
export function ormConfig(databaseUrl: string, opts: { debug?: boolean; poolMax?: number } = {}) {
  return defineConfig({
    clientUrl: databaseUrl,
    entities,
    extensions: [Migrator],
    debug: opts.debug ?? false,
    pool: { min: 0, max: opts.poolMax ?? 10 },
    forceUtcTimezone: true,
    migrations: {
      path: migrationsDir,
      pathTs: migrationsDir,
      glob: '!(*.d).{js,ts}',
      transactional: true,
      snapshot: false,
      emit: 'ts',
    },
    // Requests fork their own EntityManager (RequestContext); the global one is never used by mistake.
    allowGlobalContext: false,
  });
}
