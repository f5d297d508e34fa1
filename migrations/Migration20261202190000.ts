import { Migration } from '@mikro-orm/migrations';

/**
 * Build plans (server/modules/plans): the plan, one frozen row per send (plan_version), the
 * payment provider's events already handled (payment_event, keyed by the provider's event id so
 * a replay or a duplicate is ignored), and the shop's currency and deposit rule.
 */
export class Migration20261202190000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`alter table "shop" add column "currency" varchar(3) not null default 'usd', add column "deposit_mode" varchar(16) not null default 'off', add column "deposit_percent" int not null default 0, add column "deposit_fixed_cents" int not null default 0;`);

    this.addSql(`create table "plan" ("id" uuid not null, "shop_id" uuid not null, "created_at" timestamptz not null, "bike_id" uuid not null, "title" varchar(200) not null, "note" text null, "status" varchar(16) not null default 'draft', "version" int not null default 0, "items" jsonb not null, "total_cost_cents" int not null default 0, "currency" varchar(3) not null default 'usd', "prediction" jsonb not null, "sent_at" timestamptz null, "valid_until" timestamptz null, "link_token_hash" varchar(64) null, "accepted_at" timestamptz null, "accepted_name" varchar(200) null, "accepted_ip" varchar(64) null, "accepted_version" int null, "declined_at" timestamptz null, "decline_reason" text null, "deposit_cents" int not null default 0, "deposit_paid_cents" int not null default 0, "deposit_refunded_cents" int not null default 0, "checkout_session_id" varchar(255) null, "payment_intent_id" varchar(255) null, "converted_stage_id" uuid null, "created_by_id" uuid null, "updated_at" timestamptz not null, constraint "plan_pkey" primary key ("id"));`);
    this.addSql(`create index "plan_shop_id_bike_id_index" on "plan" ("shop_id", "bike_id");`);
    this.addSql(`alter table "plan" add constraint "plan_link_token_hash_unique" unique ("link_token_hash");`);
    this.addSql(`alter table "plan" add constraint "plan_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "plan" add constraint "plan_bike_id_foreign" foreign key ("bike_id") references "bike" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "plan" add constraint "plan_converted_stage_id_foreign" foreign key ("converted_stage_id") references "stage" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "plan" add constraint "plan_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`create table "plan_version" ("id" uuid not null, "shop_id" uuid not null, "created_at" timestamptz not null, "plan_id" uuid not null, "version" int not null, "sent_to" varchar(320) not null, "title" varchar(200) not null, "items" jsonb not null, "total_cost_cents" int not null, "deposit_cents" int not null, "currency" varchar(3) not null, "prediction" jsonb not null, "pdf_key" varchar(500) not null, constraint "plan_version_pkey" primary key ("id"));`);
    this.addSql(`alter table "plan_version" add constraint "plan_version_plan_id_version_unique" unique ("plan_id", "version");`);
    this.addSql(`alter table "plan_version" add constraint "plan_version_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "plan_version" add constraint "plan_version_plan_id_foreign" foreign key ("plan_id") references "plan" ("id") on update cascade on delete cascade;`);

    this.addSql(`create table "payment_event" ("event_id" varchar(255) not null, "type" varchar(100) not null, "plan_id" uuid null, "outcome" varchar(64) not null, "received_at" timestamptz not null, constraint "payment_event_pkey" primary key ("event_id"));`);
    this.addSql(`alter table "payment_event" add constraint "payment_event_plan_id_foreign" foreign key ("plan_id") references "plan" ("id") on update cascade on delete set null;`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "payment_event" cascade;`);
    this.addSql(`drop table if exists "plan_version" cascade;`);
    this.addSql(`drop table if exists "plan" cascade;`);
    this.addSql(`alter table "shop" drop column "currency", drop column "deposit_mode", drop column "deposit_percent", drop column "deposit_fixed_cents";`);
  }
}
