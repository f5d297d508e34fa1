import { Migration } from '@mikro-orm/migrations';

/**
 * Indexes of the other everyday lists at archive scale (Migration20261202170000 did the runs):
 * each list's order within the shop, so a page is the first rows of an index walk.
 * - comparisons and reports, newest first (their SQL read models in comparisons/list-comparisons.ts
 *   and reports/list-reports.ts);
 * - sessions of the whole shop, newest first;
 * - bikes and customers, newest first (the Today page's "recent" lists);
 * - trigram indexes on the customer's name, e-mail and phone, and on the VIN: the search boxes
 *   match them with ILIKE '%…%'.
 */
export class Migration20261202171000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create extension if not exists pg_trgm;`);
    this.addSql(`create index "comparison_list_created" on "comparison" ("shop_id", "created_at" desc, "id");`);
    this.addSql(`create index "report_list_created" on "report" ("shop_id", "created_at" desc, "version" desc);`);
    this.addSql(`create index "dyno_session_list_started" on "dyno_session" ("shop_id", "started_at" desc, "id");`);
    this.addSql(`create index "bike_list_created" on "bike" ("shop_id", "created_at", "id");`);
    this.addSql(`create index "customer_list_created" on "customer" ("shop_id", "created_at", "id");`);
    this.addSql(`create index "customer_name_trgm" on "customer" using gin ("name" gin_trgm_ops);`);
    this.addSql(`create index "customer_email_trgm" on "customer" using gin ("email" gin_trgm_ops);`);
    this.addSql(`create index "customer_phone_trgm" on "customer" using gin ("phone" gin_trgm_ops);`);
    this.addSql(`create index "bike_vin_trgm" on "bike" using gin ("vin" gin_trgm_ops);`);
  }

  override async down(): Promise<void> {
    for (const name of ['comparison_list_created', 'report_list_created', 'dyno_session_list_started', 'bike_list_created', 'customer_list_created',
      'customer_name_trgm', 'customer_email_trgm', 'customer_phone_trgm', 'bike_vin_trgm']) {
      this.addSql(`drop index if exists "${name}";`);
    }
  }
}
