import { Migration } from '@mikro-orm/migrations';

/**
 * Tables the ORM does not model: the session store (connect-pg-simple's layout) and the
 * fixed-window rate limiter, both shared by every app instance so the server stays stateless.
 */
export class Migration20261201220500 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create table "http_session" ("sid" varchar not null primary key, "sess" json not null, "expire" timestamp(6) not null);`);
    this.addSql(`create index "http_session_expire_index" on "http_session" ("expire");`);
    this.addSql(`create table "rate_limit" ("key" varchar(300) not null primary key, "window_start" timestamptz not null, "hits" int not null);`);
    this.addSql(`create unique index "app_user_email_lower_unique" on "app_user" (lower("email"));`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "http_session";`);
    this.addSql(`drop table if exists "rate_limit";`);
    this.addSql(`drop index if exists "app_user_email_lower_unique";`);
  }
}
