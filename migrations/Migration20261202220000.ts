import { Migration } from '@mikro-orm/migrations';

/**
 * The shop's IANA time zone. "Today's session" on a dyno and the dates printed on reports and
 * build-plan quotes follow the shop's calendar day, not the server's (UTC in a hosted deployment).
 */
export class Migration20261202220000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`alter table "shop" add column "time_zone" varchar(64) not null default 'UTC';`);
  }

  override async down(): Promise<void> {
    this.addSql(`alter table "shop" drop column "time_zone";`);
  }
}
