import { Migration } from '@mikro-orm/migrations';

/**
 * List-order indexes for the bikes and customers lists: (shop_id, sort field, id), walked from
 * either end now that the id tie-break follows the sort's direction. The first page of a sort
 * reads its few rows instead of sorting every bike or customer of the shop.
 */
export class Migration20261202231000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create index if not exists "bike_list_make" on "bike" ("shop_id", "make", "id");`);
    this.addSql(`create index if not exists "bike_list_model" on "bike" ("shop_id", "model", "id");`);
    this.addSql(`create index if not exists "bike_list_year" on "bike" ("shop_id", "year", "id");`);
    this.addSql(`create index if not exists "bike_list_displacement" on "bike" ("shop_id", "displacement_cc", "id");`);
    this.addSql(`create index if not exists "customer_list_name" on "customer" ("shop_id", "name", "id");`);
    this.addSql(`create index if not exists "customer_list_email" on "customer" ("shop_id", "email", "id");`);
  }

  override async down(): Promise<void> {
    for (const name of ['bike_list_make', 'bike_list_model', 'bike_list_year', 'bike_list_displacement', 'customer_list_name', 'customer_list_email']) {
      this.addSql(`drop index if exists "${name}";`);
    }
  }
}
