import { Migration } from '@mikro-orm/migrations';

/**
 * Several pulls per log (run.entity.ts): each pull of a raw file is its own run on the same stored
 * object, told apart by pull_index (0-based, time order) out of pull_count, with where the pull
 * lies in the log (time column values and data-row indices; null when unknown). The duplicate
 * check per bike stays on the file's SHA-256: unique per (bike, file, pull), so re-uploading a
 * file matches every one of its runs. rpm_per_speed: the engine-speed ratio ({ ratio, unit })
 * given for a log without an engine-speed column, used again on re-processing.
 */
export class Migration20261202140000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`alter table "run" add column "pull_index" int not null default 0, add column "pull_count" int not null default 1, add column "pull_start_s" double precision null, add column "pull_end_s" double precision null, add column "pull_first_row" int null, add column "pull_last_row" int null, add column "rpm_per_speed" jsonb null;`);
    this.addSql(`alter table "run" drop constraint "run_bike_id_raw_sha256_unique";`);
    this.addSql(`alter table "run" add constraint "run_bike_id_raw_sha256_pull_index_unique" unique ("bike_id", "raw_sha256", "pull_index");`);
  }

  override async down(): Promise<void> {
    this.addSql(`delete from "run" where "pull_index" > 0;`);
    this.addSql(`alter table "run" drop constraint "run_bike_id_raw_sha256_pull_index_unique";`);
    this.addSql(`alter table "run" add constraint "run_bike_id_raw_sha256_unique" unique ("bike_id", "raw_sha256");`);
    this.addSql(`alter table "run" drop column "pull_index", drop column "pull_count", drop column "pull_start_s", drop column "pull_end_s", drop column "pull_first_row", drop column "pull_last_row", drop column "rpm_per_speed";`);
  }
}
