import { Migration } from '@mikro-orm/migrations';

/**
 * A run's updated_at changes whenever its curve does, whoever writes it: the comparison read
 * model caches parsed curves by (run id, updated_at) (server/modules/comparisons/comparison-runs.ts),
 * so a write that forgets the column (hand-written SQL, a future bulk job) must not leave a stale
 * curve in that cache. The ORM already sets the column on its own updates; this only steps in
 * when a curve changed and updated_at did not.
 */
export class Migration20261202030000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create or replace function run_curve_version() returns trigger language plpgsql as $$
      begin
        new.updated_at := clock_timestamp();
        return new;
      end $$;`);
    this.addSql(`create trigger run_curve_version before update of curve on "run" for each row
      when (old.curve is distinct from new.curve and new.updated_at is not distinct from old.updated_at)
      execute function run_curve_version();`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop trigger if exists run_curve_version on "run";`);
    this.addSql(`drop function if exists run_curve_version();`);
  }
}
