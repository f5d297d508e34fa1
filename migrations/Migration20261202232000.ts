import { Migration } from '@mikro-orm/migrations';

/**
 * The bikes list's search box at archive scale. Before, a search was five ILIKEs OR-ed across
 * bike and customer (make, model, VIN, engine family, customer's name): no index could serve
 * the OR across the join, so each search read every bike of the shop and its customer.
 *
 * - bike.search_text: those five in one column (a words-spanning search such as "vantor 103",
 *   make then model, matches too), kept by a row trigger on bike and, for the customer's name, by
 *   a trigger on customer; a GIN trigram index serves ILIKE '%…%'. Not an entity property:
 *   the database owns it, as run.search_text.
 * - run_search_text_on_customer now finds the customer's bikes through (shop_id, customer_id).
 */
export class Migration20261202232000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`alter table "bike" add column "search_text" text null;`);
    this.addSql(`create or replace function bike_search_text_fill() returns trigger language plpgsql as $fn$
      begin
        if tg_op = 'INSERT' or new.search_text is null
           or new.make is distinct from old.make or new.model is distinct from old.model or new.vin is distinct from old.vin
           or new.engine_family is distinct from old.engine_family or new.customer_id is distinct from old.customer_id then
          new.search_text := concat_ws(' ', new.make, new.model, new.vin, new.engine_family, (select c.name from customer c where c.id = new.customer_id));
        end if;
        return new;
      end $fn$;`);
    this.addSql(`create trigger "bike_search_text_fill" before insert or update on "bike" for each row execute function bike_search_text_fill();`);
    this.addSql(`create or replace function bike_search_text_on_customer() returns trigger language plpgsql as $fn$
      begin
        if new.name is distinct from old.name then
          update bike set search_text = null where shop_id = new.shop_id and customer_id = new.id;
        end if;
        return null;
      end $fn$;`);
    this.addSql(`create trigger "bike_search_text_customer" after update on "customer" for each row execute function bike_search_text_on_customer();`);
    this.addSql(`create or replace function run_search_text_on_customer() returns trigger language plpgsql as $fn$
      begin
        if new.name is distinct from old.name then
          update run set search_text = null where bike_id in (select id from bike where shop_id = new.shop_id and customer_id = new.id);
        end if;
        return null;
      end $fn$;`);
    this.addSql(`update bike b set search_text = concat_ws(' ', b.make, b.model, b.vin, b.engine_family, c.name) from customer c where c.id = b.customer_id;`);
    this.addSql(`create index "bike_search_trgm" on "bike" using gin ("search_text" gin_trgm_ops);`);
    // As for run.search_text: a long histogram tells a rare word (trigram index) from a common one.
    this.addSql(`alter table "bike" alter column "search_text" set statistics 1000;`);
    this.addSql(`analyze bike;`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop trigger if exists "bike_search_text_customer" on "customer";`);
    this.addSql(`drop trigger if exists "bike_search_text_fill" on "bike";`);
    this.addSql(`drop function if exists bike_search_text_on_customer();`);
    this.addSql(`drop function if exists bike_search_text_fill();`);
    this.addSql(`alter table "bike" drop column "search_text";`);
  }
}
