/**
 * Write a migration from the difference between the entities and a scratch database that has
 * every existing migration applied: `npx tsx scripts/make-migration.ts [--initial]`.
 * Needs the local cluster running (npm start does that) or DATABASE_URL.
 */
import { initOrm } from '../server/db/orm';

const url = process.env.DATABASE_URL ?? 'postgres://pullbook@127.0.0.1:55432/pullbook_migration_scratch';
const admin = url.replace(/\/[^/]+$/, '/postgres');
const pg = await import('pg');
const c = new pg.default.Client({ connectionString: admin });
await c.connect();
const db = new URL(url).pathname.slice(1);
await c.query(`drop database if exists "${db}"`);
await c.query(`create database "${db}"`);
await c.end();

const orm = await initOrm(url);
const migrator = orm.getMigrator();
await migrator.up();
const result = process.argv.includes('--initial') ? await migrator.createInitialMigration() : await migrator.createMigration();
console.log(result.fileName ? `wrote migrations/${result.fileName}` : 'no schema changes');
await orm.close();
