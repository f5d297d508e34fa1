import pg from 'pg';
import { seedLarge } from '../../server/cli/seed-large.js';
import { initOrm, migrateToLatest } from '../../server/db/orm.js';

/**
 * Makes sure the database at `url` is migrated and holds exactly `bikes` seeded bikes
 * (seed:large), seeding it when it does not. A database seeded by an earlier run may predate the
 * latest migrations (they backfill), so it is migrated first.
 */
export async function ensureLargeSeed(url: string, bikes: number): Promise<void> {
  const check = new pg.Client({ connectionString: url });
  await check.connect();
  const have = await check
    .query(`select count(*)::int as n from bike b join shop s on s.id = b.shop_id where s.name like 'Large Seed Shop %'`)
    .then((r) => r.rows[0].n as number)
    .catch(() => 0);
  // A seed from before sessions, comparisons, reports and audit lines were seeded is seeded again.
  const sessions = await check
    .query(`select count(*)::int as n from dyno_session d join shop s on s.id = d.shop_id where s.name like 'Large Seed Shop %'`)
    .then((r) => r.rows[0].n as number)
    .catch(() => 0);
  await check.end();
  const orm = await initOrm(url, { poolMax: 2 });
  try {
    await migrateToLatest(orm);
  } finally {
    await orm.close();
  }
  if (have !== bikes || sessions === 0) {
    process.stdout.write(`seeding ${bikes} bikes (seed:large)…\n`);
    const r = await seedLarge(url, { bikes, log: (line) => process.stdout.write(`${line}\n`) });
    process.stdout.write(`seeded ${r.bikes} bikes, ${r.stages} stages, ${r.parts} parts, ${r.runs} runs, ${r.sessions} sessions, ${r.comparisons} comparisons, ${r.reports} reports, ${r.auditEntries} audit lines in ${(r.ms / 1000).toFixed(1)} s\n`);
  }
}
