import { Migration } from '@mikro-orm/migrations';

/**
 * Indexes of the build finder (server/modules/builds/build-search.service.ts), hand-written.
 *
 * Choices:
 * - pg_trgm GIN indexes (gin_trgm_ops) on bike.engine_family, make and model, and on
 *   part.description: the finder matches engine families fuzzily (`<%` word similarity, `%`
 *   similarity) and make / model / part text as substrings (ILIKE '%…%'); GIN trigram indexes
 *   serve all of those operators. GIN rather than GiST: the tables are read far more than written
 *   and GIN lookups are faster; ranking by similarity is computed on the few matching rows.
 * - Full-text search uses expression GIN indexes, not generated tsvector columns, so the ORM's
 *   entity schemas stay exactly what the entities declare (no column the ORM does not know).
 *   The service repeats each expression verbatim — the planner only uses an expression index
 *   when the query's expression is the same — which is why they are spelled out here:
 *     part:  to_tsvector('english', description)
 *     stage: to_tsvector('english', name || ' ' || coalesce(description, ''))
 *     run:   to_tsvector('english', coalesce(note, ''))
 *   'english' stems words ("ported" finds "port"), which suits workshop notes.
 * - run.tags: GIN (array containment `tags @> array[…]`).
 * - btree: part(stage_id, category, head_work_level) for the "parts present in the build"
 *   semi-joins (the existing index leads with shop_id and cannot serve a lookup by stage);
 *   stage(shop_id, gain_peak_power_hp) for "best gain first" pages; bike(shop_id, displacement_cc)
 *   and bike(shop_id, cylinders) for the range / equality filters; stage(bike_id, position) for
 *   walking one bike's build in order.
 */
export class Migration20261201235000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create extension if not exists pg_trgm;`);

    this.addSql(`create index if not exists "bike_engine_family_trgm" on "bike" using gin ("engine_family" gin_trgm_ops);`);
    this.addSql(`create index if not exists "bike_make_trgm" on "bike" using gin ("make" gin_trgm_ops);`);
    this.addSql(`create index if not exists "bike_model_trgm" on "bike" using gin ("model" gin_trgm_ops);`);
    this.addSql(`create index if not exists "part_description_trgm" on "part" using gin ("description" gin_trgm_ops);`);

    this.addSql(`create index if not exists "part_description_fts" on "part" using gin (to_tsvector('english', "description"));`);
    this.addSql(`create index if not exists "stage_text_fts" on "stage" using gin (to_tsvector('english', "name" || ' ' || coalesce("description", '')));`);
    this.addSql(`create index if not exists "run_note_fts" on "run" using gin (to_tsvector('english', coalesce("note", '')));`);
    this.addSql(`create index if not exists "run_tags_gin" on "run" using gin ("tags");`);

    this.addSql(`create index if not exists "part_stage_id_category_index" on "part" ("stage_id", "category", "head_work_level");`);
    this.addSql(`create index if not exists "stage_shop_id_gain_index" on "stage" ("shop_id", "gain_peak_power_hp");`);
    this.addSql(`create index if not exists "stage_bike_id_position_index" on "stage" ("bike_id", "position");`);
    this.addSql(`create index if not exists "bike_shop_id_displacement_index" on "bike" ("shop_id", "displacement_cc");`);
    this.addSql(`create index if not exists "bike_shop_id_cylinders_index" on "bike" ("shop_id", "cylinders");`);
  }

  override async down(): Promise<void> {
    for (const name of [
      'bike_engine_family_trgm', 'bike_make_trgm', 'bike_model_trgm', 'part_description_trgm',
      'part_description_fts', 'stage_text_fts', 'run_note_fts', 'run_tags_gin',
      'part_stage_id_category_index', 'stage_shop_id_gain_index', 'stage_bike_id_position_index',
      'bike_shop_id_displacement_index', 'bike_shop_id_cylinders_index',
    ]) {
      this.addSql(`drop index if exists "${name}";`);
    }
  }
}
