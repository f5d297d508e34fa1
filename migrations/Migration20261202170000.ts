import { Migration } from '@mikro-orm/migrations';

/**
 * The run list at archive scale (server/modules/runs/run-list-sql.ts). Hand-written.
 *
 * - run.search_text: what the list's search box matches, in one column so one trigram index
 *   serves it: the run's file name, label, note and tags, its bike's make, model and engine
 *   family, the customer's name and the stage's name. A row trigger fills it on insert and when
 *   one of the run's own fields changes (or when something sets it to null: the bike, customer
 *   and stage triggers below do that for the runs they touch, and the row trigger recomputes).
 * - GIN trigram index on it (pg_trgm): ILIKE '%…%' of three characters or more is an index scan.
 * - One partial index (live runs) per list order, matching the ORDER BY exactly so a page is the
 *   first rows of an index walk (keyset or small offset), never a sort of the shop's runs:
 *   -createdAt, createdAt, ±peakPowerHp and ±peakTorqueLbft (nulls last, then newest, then id).
 * - status filter: (shop, status, newest first).
 * - stage.reference_run_id: the list's "is a reference run" flag per row.
 */
export class Migration20261202170000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create extension if not exists pg_trgm;`);
    this.addSql(`alter table "run" add column "search_text" text null;`);
    this.addSql(`create or replace function run_search_text_of(p_bike uuid, p_stage uuid, p_name text, p_label text, p_note text, p_tags text[]) returns text
      language sql stable as $fn$
        select concat_ws(' ', p_name, p_label, p_note, array_to_string(p_tags, ' '), b.make, b.model, b.engine_family, c.name,
                         (select st.name from stage st where st.id = p_stage))
          from bike b join customer c on c.id = b.customer_id
         where b.id = p_bike
      $fn$;`);
    this.addSql(`create or replace function run_search_text_fill() returns trigger language plpgsql as $fn$
      begin
        if tg_op = 'INSERT' or new.search_text is null
           or new.bike_id is distinct from old.bike_id or new.stage_id is distinct from old.stage_id
           or new.original_name is distinct from old.original_name or new.label is distinct from old.label
           or new.note is distinct from old.note or new.tags is distinct from old.tags then
          new.search_text := run_search_text_of(new.bike_id, new.stage_id, new.original_name, new.label, new.note, new.tags);
        end if;
        return new;
      end $fn$;`);
    this.addSql(`create trigger "run_search_text_fill" before insert or update on "run" for each row execute function run_search_text_fill();`);
    // Related rows renamed: their runs recompute (setting null asks the row trigger to).
    this.addSql(`create or replace function run_search_text_on_bike() returns trigger language plpgsql as $fn$
      begin
        if new.make is distinct from old.make or new.model is distinct from old.model
           or new.engine_family is distinct from old.engine_family or new.customer_id is distinct from old.customer_id then
          update run set search_text = null where bike_id = new.id;
        end if;
        return null;
      end $fn$;`);
    this.addSql(`create or replace function run_search_text_on_customer() returns trigger language plpgsql as $fn$
      begin
        if new.name is distinct from old.name then
          update run set search_text = null where bike_id in (select id from bike where customer_id = new.id);
        end if;
        return null;
      end $fn$;`);
    this.addSql(`create or replace function run_search_text_on_stage() returns trigger language plpgsql as $fn$
      begin
        if new.name is distinct from old.name then
          update run set search_text = null where stage_id = new.id;
        end if;
        return null;
      end $fn$;`);
    this.addSql(`create trigger "run_search_text_bike" after update on "bike" for each row execute function run_search_text_on_bike();`);
    this.addSql(`create trigger "run_search_text_customer" after update on "customer" for each row execute function run_search_text_on_customer();`);
    this.addSql(`create trigger "run_search_text_stage" after update on "stage" for each row execute function run_search_text_on_stage();`);
    // Backfill in one statement (the row trigger keeps a value set without a change to the run's own fields).
    this.addSql(`update run r set search_text = concat_ws(' ', r.original_name, r.label, r.note, array_to_string(r.tags, ' '), b.make, b.model, b.engine_family, c.name,
                                                    (select st.name from stage st where st.id = r.stage_id))
      from bike b join customer c on c.id = b.customer_id
     where b.id = r.bike_id;`);
    this.addSql(`create index "run_search_trgm" on "run" using gin ("search_text" gin_trgm_ops);`);
    // The planner estimates ILIKE '%…%' from the column's histogram (a pattern no histogram entry
    // matches gets about 1 / entries): 1 000 entries tell a rare word (trigram index) from a
    // common one (walk the order's index and filter) far better than the default 100.
    this.addSql(`alter table "run" alter column "search_text" set statistics 1000;`);
    this.addSql(`create index "run_list_created_desc" on "run" ("shop_id", "created_at" desc, "id") where "deleted_at" is null;`);
    this.addSql(`create index "run_list_created_asc" on "run" ("shop_id", "created_at", "id") where "deleted_at" is null;`);
    for (const col of ['peak_power_hp', 'peak_torque_lbft']) {
      // Nulls last both ways: the list sorts coalesce(peak, -Infinity) descending, coalesce(peak, Infinity) ascending.
      this.addSql(`create index "run_list_${col}_desc" on "run" ("shop_id", (coalesce("${col}", '-Infinity'::float8)) desc, "created_at" desc, "id") where "deleted_at" is null;`);
      this.addSql(`create index "run_list_${col}_asc" on "run" ("shop_id", (coalesce("${col}", 'Infinity'::float8)) asc, "created_at" desc, "id") where "deleted_at" is null;`);
    }
    this.addSql(`create index "run_list_status" on "run" ("shop_id", "status", "created_at" desc, "id") where "deleted_at" is null;`);
    this.addSql(`create index "stage_reference_run_id_index" on "stage" ("reference_run_id") where "reference_run_id" is not null;`);
  }

  override async down(): Promise<void> {
    for (const name of ['run_search_trgm', 'run_list_created_desc', 'run_list_created_asc', 'run_list_peak_power_hp_desc', 'run_list_peak_power_hp_asc',
      'run_list_peak_torque_lbft_desc', 'run_list_peak_torque_lbft_asc', 'run_list_status', 'stage_reference_run_id_index']) {
      this.addSql(`drop index if exists "${name}";`);
    }
    this.addSql(`drop trigger if exists "run_search_text_fill" on "run";`);
    this.addSql(`drop trigger if exists "run_search_text_bike" on "bike";`);
    this.addSql(`drop trigger if exists "run_search_text_customer" on "customer";`);
    this.addSql(`drop trigger if exists "run_search_text_stage" on "stage";`);
    this.addSql(`drop function if exists run_search_text_fill(), run_search_text_on_bike(), run_search_text_on_customer(), run_search_text_on_stage();`);
    this.addSql(`drop function if exists run_search_text_of(uuid, uuid, text, text, text, text[]);`);
    this.addSql(`alter table "run" drop column "search_text";`);
  }
}
