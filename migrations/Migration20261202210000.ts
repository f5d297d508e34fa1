import { Migration } from '@mikro-orm/migrations';

/**
 * build_index_refresh(bike ids) deletes a bike's rows and inserts them again. Two transactions
 * refreshing the same bike at once (two people tagging runs of one stage) both deleted, then both
 * inserted, and the second failed on the primary key. The refresh now first takes a
 * transaction-scoped advisory lock per bike, in id order (no deadlock between refreshes); the
 * second waits for the first to commit and then, in READ COMMITTED, its delete sees the rows the
 * first inserted. The work itself is unchanged, renamed build_index_rebuild.
 */
export class Migration20261202210000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`alter function build_index_refresh(uuid[]) rename to build_index_rebuild;`);
    this.addSql(`create function build_index_refresh(bike_ids uuid[]) returns void language plpgsql as $fn$
      begin
        perform pg_advisory_xact_lock(hashtext('build_index'), hashtext(b::text))
          from (select distinct unnest(bike_ids) as b order by 1) locked;
        perform build_index_rebuild(bike_ids);
      end;
    $fn$;`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop function build_index_refresh(uuid[]);`);
    this.addSql(`alter function build_index_rebuild(uuid[]) rename to build_index_refresh;`);
  }
}
