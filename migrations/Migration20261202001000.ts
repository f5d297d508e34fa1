import { Migration } from '@mikro-orm/migrations';

/**
 * build_index: one denormalised row per stage, what the build finder reads
 * (server/modules/builds/build-*.service.ts). Hand-written; no entity (raw SQL only).
 *
 * Each row carries the bike's searchable fields, the stage's gains and costs, and the
 * CUMULATIVE build up to that stage (parts of this stage and of every earlier stage of the same
 * bike), so a search never walks a bike's stages, parts or runs:
 * - categories       cumulative part categories (sorted, distinct)
 * - part_keys        categories plus 'category:head_work_level' for parts with a level
 *                    ("cylinder-heads:mild-port"), so "heads at mild port or better" is an overlap
 * - own_part_keys    the same, for this stage's own parts only (typical outcome: where a part was added)
 * - parts_text       cumulative part descriptions, one a line, in build order
 * - parts            the cumulative parts as the API answers them (BuildPartDto[])
 * - run_tags         tags of this stage's runs that are not deleted
 * - search_tsv       'english' full text of the stage name and description, the notes of this
 *                    stage's runs (not deleted) and the cumulative part descriptions
 * - prev_gain_*      gains of the nearest earlier measured stage (null when none)
 *
 * build_family lists the engine families of each shop's bikes (pg_trgm GIN): the finder decides a
 * fuzzy engine match once per family, then reads that family's builds by btree. The refresh adds
 * families and never removes one; a family no bike has any more simply matches no build.
 *
 * Maintenance: build_index_refresh(bike ids) rebuilds the rows of those bikes. Statement-level
 * triggers on bike, stage, part and run call it for the bikes a statement touched, so every write
 * path (services, CLI, seeds, hand-written SQL in tests) keeps it current; refreshBikeOutcomes'
 * writes to the stage gain columns reach it the same way. A session may set
 * pullbook.build_index_deferred = 'on' to skip the triggers during a bulk load and call
 * build_index_refresh itself afterwards (server/cli/seed-large.ts does).
 *
 * Indexes: btree (shop_id, gain, stage_id) and (shop_id, stage_date, stage_id) over measured
 * stages for the keyset pages in gain and date order; GIN on run_tags (array containment); GIN
 * on search_tsv; pg_trgm GIN on make, model and parts_text (ILIKE
 * '%…%'); btree (shop_id,
 * displacement_cc) for ranges, (shop_id, engine_family, stage_id) over measured stages for the
 * builds of matched families in id order;
 * (bike_id, stage_position) for one bike's build. part_keys has no index on purpose: nine
 * categories, each common in a shop, so a GIN bitmap over every shop's rows costs more than
 * filtering along those walks (and the planner, misjudging combined containment, would pick it).
 */
export class Migration20261202001000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create extension if not exists pg_trgm;`);
    this.addSql(`create table "build_index" (
      "stage_id" uuid not null primary key references "stage" ("id") on delete cascade,
      "shop_id" uuid not null,
      "bike_id" uuid not null references "bike" ("id") on delete cascade,
      "customer_id" uuid not null,
      "make" varchar(100) not null,
      "model" varchar(100) not null,
      "year" int null,
      "engine_family" varchar(100) null,
      "displacement_cc" double precision null,
      "cylinders" int null,
      "stage_name" varchar(120) not null,
      "stage_position" int not null,
      "stage_date" date not null,
      "gain_peak_power_hp" double precision null,
      "gain_peak_torque_lbft" double precision null,
      "gain_area_pct" double precision null,
      "gain_average_power_hp" double precision null,
      "prev_gain_peak_power_hp" double precision null,
      "prev_gain_average_power_hp" double precision null,
      "total_cost_cents" int not null,
      "cumulative_cost_cents" bigint not null,
      "categories" text[] not null,
      "part_keys" text[] not null,
      "own_part_keys" text[] not null,
      "parts_text" text not null,
      "parts" jsonb not null,
      "run_tags" text[] not null,
      "search_tsv" tsvector not null
    );`);

    this.addSql(`create table "build_family" (
      "shop_id" uuid not null references "shop" ("id") on delete cascade,
      "engine_family" varchar(100) not null,
      primary key ("shop_id", "engine_family"));`);

    this.addSql(`create or replace function build_index_refresh(bike_ids uuid[]) returns void language sql as $fn$
      delete from build_index where bike_id in (select unnest(bike_ids));
      insert into build_index (stage_id, shop_id, bike_id, customer_id, make, model, year, engine_family, displacement_cc, cylinders,
                               stage_name, stage_position, stage_date, gain_peak_power_hp, gain_peak_torque_lbft, gain_area_pct, gain_average_power_hp,
                               prev_gain_peak_power_hp, prev_gain_average_power_hp, total_cost_cents, cumulative_cost_cents,
                               categories, part_keys, own_part_keys, parts_text, parts, run_tags, search_tsv)
      select s.id, s.shop_id, s.bike_id, b.customer_id, b.make, b.model, b.year, b.engine_family, b.displacement_cc, b.cylinders,
             s.name, s.position, coalesce(s.date, s.created_at::date), s.gain_peak_power_hp, s.gain_peak_torque_lbft, s.gain_area_pct, s.gain_average_power_hp,
             prev.gain_peak_power_hp, prev.gain_average_power_hp, s.total_cost_cents, cum.cost,
             cum.categories, cum.part_keys, own.part_keys, cum.txt, cum.parts, runs.tags,
             to_tsvector('english', s.name || ' ' || coalesce(s.description, ''))
               || to_tsvector('english', runs.notes)
               || to_tsvector('english', cum.txt)
        from stage s
        join bike b on b.id = s.bike_id
        cross join lateral (
          select coalesce(sum(p.part_cost_cents + p.labour_cost_cents), 0)::bigint as cost,
                 coalesce(array_agg(distinct p.category::text), '{}') as categories,
                 coalesce(array(select distinct k from unnest(array_agg(p.category::text) || array_agg(p.category || ':' || p.head_work_level)) k
                                 where k is not null order by k), '{}') as part_keys,
                 coalesce(string_agg(p.description, E'\\n' order by ps.position, p.created_at, p.id), '') as txt,
                 coalesce(jsonb_agg(jsonb_build_object('category', p.category, 'description', p.description, 'headWorkLevel', p.head_work_level,
                                                       'addedInThisStage', ps.id = s.id, 'costCents', p.part_cost_cents + p.labour_cost_cents)
                                    order by ps.position, p.created_at, p.id) filter (where p.id is not null), '[]'::jsonb) as parts
            from stage ps join part p on p.stage_id = ps.id
           where ps.bike_id = s.bike_id and ps.position <= s.position) cum
        cross join lateral (
          select coalesce(array(select distinct k from unnest(array_agg(p.category::text) || array_agg(p.category || ':' || p.head_work_level)) k
                                 where k is not null order by k), '{}') as part_keys
            from part p where p.stage_id = s.id) own
        cross join lateral (
          select coalesce(string_agg(r.note, E'\\n' order by r.sequence, r.id), '') as notes,
                 coalesce(array(select distinct t from run rt, unnest(rt.tags) t where rt.shop_id = s.shop_id and rt.stage_id = s.id and rt.deleted_at is null order by t), '{}') as tags
            from run r where r.shop_id = s.shop_id and r.stage_id = s.id and r.deleted_at is null) runs
        left join lateral (
          select ps.gain_peak_power_hp, ps.gain_average_power_hp from stage ps
           where ps.bike_id = s.bike_id and ps.position < s.position and ps.gain_peak_power_hp is not null
           order by ps.position desc limit 1) prev on true
       where s.bike_id in (select unnest(bike_ids));
      insert into build_family (shop_id, engine_family)
      select distinct b.shop_id, b.engine_family from bike b where b.id in (select unnest(bike_ids)) and b.engine_family is not null
      on conflict do nothing;
    $fn$;`);

    // One trigger function per table; transition tables need one trigger per event.
    const deferred = `if coalesce(current_setting('pullbook.build_index_deferred', true), '') = 'on' then return null; end if;`;
    this.addSql(`create or replace function build_index_on_stage() returns trigger language plpgsql as $fn$
      begin
        ${deferred}
        if tg_op = 'INSERT' then perform build_index_refresh(array(select distinct bike_id from new_rows));
        elsif tg_op = 'UPDATE' then perform build_index_refresh(array(select bike_id from new_rows union select bike_id from old_rows));
        else perform build_index_refresh(array(select distinct bike_id from old_rows));
        end if;
        return null;
      end $fn$;`);
    this.addSql(`create or replace function build_index_on_part() returns trigger language plpgsql as $fn$
      begin
        ${deferred}
        if tg_op = 'INSERT' then perform build_index_refresh(array(select distinct s.bike_id from new_rows p join stage s on s.id = p.stage_id));
        elsif tg_op = 'UPDATE' then perform build_index_refresh(array(select s.bike_id from stage s where s.id in (select stage_id from new_rows union select stage_id from old_rows)));
        else perform build_index_refresh(array(select distinct s.bike_id from old_rows p join stage s on s.id = p.stage_id));
        end if;
        return null;
      end $fn$;`);
    this.addSql(`create or replace function build_index_on_run() returns trigger language plpgsql as $fn$
      begin
        ${deferred}
        if tg_op = 'INSERT' then perform build_index_refresh(array(select distinct bike_id from new_rows where stage_id is not null));
        elsif tg_op = 'UPDATE' then perform build_index_refresh(array(
          select n.bike_id from new_rows n join old_rows o on o.id = n.id
           where (n.stage_id, n.note, n.tags, n.deleted_at, n.bike_id) is distinct from (o.stage_id, o.note, o.tags, o.deleted_at, o.bike_id)
             and (n.stage_id is not null or o.stage_id is not null)
          union
          select o.bike_id from new_rows n join old_rows o on o.id = n.id
           where o.bike_id <> n.bike_id and o.stage_id is not null));
        else perform build_index_refresh(array(select distinct bike_id from old_rows where stage_id is not null));
        end if;
        return null;
      end $fn$;`);
    this.addSql(`create or replace function build_index_on_bike() returns trigger language plpgsql as $fn$
      begin
        ${deferred}
        perform build_index_refresh(array(
          select n.id from new_rows n join old_rows o on o.id = n.id
           where (n.shop_id, n.customer_id, n.make, n.model, n.year, n.engine_family, n.displacement_cc, n.cylinders)
                 is distinct from (o.shop_id, o.customer_id, o.make, o.model, o.year, o.engine_family, o.displacement_cc, o.cylinders)));
        return null;
      end $fn$;`);
    for (const table of ['stage', 'part', 'run']) {
      this.addSql(`create trigger "build_index_${table}_insert" after insert on "${table}" referencing new table as new_rows for each statement execute function build_index_on_${table}();`);
      this.addSql(`create trigger "build_index_${table}_update" after update on "${table}" referencing old table as old_rows new table as new_rows for each statement execute function build_index_on_${table}();`);
      this.addSql(`create trigger "build_index_${table}_delete" after delete on "${table}" referencing old table as old_rows for each statement execute function build_index_on_${table}();`);
    }
    // A new bike has no stages yet and a deleted one cascades: only updates matter.
    this.addSql(`create trigger "build_index_bike_update" after update on "bike" referencing old table as old_rows new table as new_rows for each statement execute function build_index_on_bike();`);

    // Backfill from the existing archive.
    this.addSql(`select build_index_refresh(array(select id from bike));`);

    this.addSql(`create index "build_index_bike_position" on "build_index" ("bike_id", "stage_position");`);
    this.addSql(`create index "build_index_shop_gain" on "build_index" ("shop_id", "gain_peak_power_hp", "stage_id") where "gain_peak_power_hp" is not null;`);
    this.addSql(`create index "build_index_shop_date" on "build_index" ("shop_id", "stage_date", "stage_id") where "gain_peak_power_hp" is not null;`);
    this.addSql(`create index "build_index_shop_family" on "build_index" ("shop_id", "engine_family", "stage_id") where "gain_peak_power_hp" is not null;`);
    this.addSql(`create index "build_family_engine_family_trgm" on "build_family" using gin ("engine_family" gin_trgm_ops);`);
    this.addSql(`create index "build_index_shop_displacement" on "build_index" ("shop_id", "displacement_cc");`);
    this.addSql(`create index "build_index_run_tags" on "build_index" using gin ("run_tags");`);
    this.addSql(`create index "build_index_search_tsv" on "build_index" using gin ("search_tsv");`);
    this.addSql(`create index "build_index_make_trgm" on "build_index" using gin ("make" gin_trgm_ops);`);
    this.addSql(`create index "build_index_model_trgm" on "build_index" using gin ("model" gin_trgm_ops);`);
    this.addSql(`create index "build_index_parts_text_trgm" on "build_index" using gin ("parts_text" gin_trgm_ops);`);
    this.addSql(`analyze "build_index";`);
  }

  override async down(): Promise<void> {
    for (const table of ['stage', 'part', 'run']) {
      for (const op of ['insert', 'update', 'delete']) this.addSql(`drop trigger if exists "build_index_${table}_${op}" on "${table}";`);
    }
    this.addSql(`drop trigger if exists "build_index_bike_update" on "bike";`);
    for (const fn of ['build_index_on_stage', 'build_index_on_part', 'build_index_on_run', 'build_index_on_bike']) this.addSql(`drop function if exists ${fn}();`);
    this.addSql(`drop function if exists build_index_refresh(uuid[]);`);
    this.addSql(`drop table if exists "build_index";`);
    this.addSql(`drop table if exists "build_family";`);
  }
}
