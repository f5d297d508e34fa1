import { MikroORM } from '@mikro-orm/postgresql';
import { ormConfig } from './orm-config';

export type Orm = MikroORM;

/** Connect the ORM. */
export async function initOrm(databaseUrl: string, opts: { poolMax?: number } = {}): Promise<Orm> {
  return MikroORM.init(ormConfig(databaseUrl, opts));
}

/** Apply every pending migration in migrations/. */
export async function migrateToLatest(orm: Orm): Promise<string[]> {
  const done = await orm.getMigrator().up();
  return done.map((m) => m.name);
}
