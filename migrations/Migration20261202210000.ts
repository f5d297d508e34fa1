import { Migration } from '@mikro-orm/migrations';

/**
 * build_index_refresh(bike ids) deletes a bike's rows and inserts them again. Two transactions
 * refreshing the same bike at once (two people tagging runs of one stage) both deleted, then both
 * inserted, and the second failed on the primary key. The refresh now first takes a
 * transaction-scoped advisory lock per bike, in id order (no deadlock between refreshes; a bulk
 * refresh of many bikes takes one lock for all instead, see below); the
 * second waits for the first to commit and then, in READ COMMITTED, its delete sees the rows the
 * first inserted. The work itself is unchanged, renamed build_index_rebuild.
 */
export class Migration20261202210000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`alter function build_index_refresh(uuid[]) rename to build_index_rebuild;`);
    // Locks live in PostgreSQL's shared lock table (max_locks_per_transaction × connections): a bulk
    // refresh (seed-large, thousands of bikes) takes one exclusive lock instead of one per bike, and
    // every small refresh holds that key shared.
    this.addSql(`create function build_index_refresh(bike_ids uuid[]) returns void language plpgsql as $fn$
      begin
        if cardinality(bike_ids) > 32 then
          perform pg_advisory_xact_lock(hashtext('build_index_all'), 0);
        else
          perform pg_advisory_xact_lock_shared(hashtext('build_index_all'), 0);
          perform pg_advisory_xact_lock(hashtext('build_index_bike'), hashtext(b::text))
            from (select distinct unnest(bike_ids) as b order by 1) locked;
        end if;
        perform build_index_rebuild(bike_ids);
      end;
    $fn$;`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop function build_index_refresh(uuid[]);`);
    this.addSql(`alter function build_index_rebuild(uuid[]) rename to build_index_refresh;`);
  }
}
