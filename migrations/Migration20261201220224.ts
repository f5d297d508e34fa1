import { Migration } from '@mikro-orm/migrations';

export class Migration20261201220224 extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "orphan_object" ("id" uuid not null, "key" varchar(500) not null, "reason" text not null, "created_at" timestamptz not null, constraint "orphan_object_pkey" primary key ("id"));`);

    this.addSql(`create table "shop" ("id" uuid not null, "name" varchar(200) not null, "address" text null, "phone" varchar(60) null, "email" varchar(320) null, "logo_key" varchar(500) null, "units" varchar(16) not null default 'imperial', "paper_size" varchar(16) not null default 'letter', "default_correction" varchar(32) not null default 'sae-j1349', "created_at" timestamptz not null, constraint "shop_pkey" primary key ("id"));`);

    this.addSql(`create table "dyno" ("id" uuid not null, "shop_id" uuid not null, "name" varchar(100) not null, "kind" varchar(16) not null default 'inertia', "notes" text null, "created_at" timestamptz not null, constraint "dyno_pkey" primary key ("id"));`);

    this.addSql(`create table "customer" ("id" uuid not null, "shop_id" uuid not null, "name" varchar(200) not null, "email" varchar(320) null, "phone" varchar(60) null, "notes" text null, "created_at" timestamptz not null, "updated_at" timestamptz not null, constraint "customer_pkey" primary key ("id"));`);
    this.addSql(`create index "customer_shop_id_name_index" on "customer" ("shop_id", "name");`);

    this.addSql(`create table "column_layout" ("id" uuid not null, "shop_id" uuid not null, "name" varchar(120) not null, "header_signature" varchar(500) not null, "mapping" jsonb not null, "created_at" timestamptz not null, constraint "column_layout_pkey" primary key ("id"));`);
    this.addSql(`alter table "column_layout" add constraint "column_layout_shop_id_header_signature_unique" unique ("shop_id", "header_signature");`);

    this.addSql(`create table "bike" ("id" uuid not null, "shop_id" uuid not null, "customer_id" uuid not null, "make" varchar(100) not null, "model" varchar(100) not null, "year" int null, "vin" varchar(17) null, "engine_family" varchar(100) null, "displacement_cc" double precision null, "cylinders" int null, "notes" text null, "created_at" timestamptz not null, "updated_at" timestamptz not null, constraint "bike_pkey" primary key ("id"));`);
    this.addSql(`create index "bike_shop_id_customer_id_index" on "bike" ("shop_id", "customer_id");`);
    this.addSql(`create index "bike_shop_id_make_model_index" on "bike" ("shop_id", "make", "model");`);

    this.addSql(`create table "app_user" ("id" uuid not null, "shop_id" uuid not null, "email" varchar(320) not null, "name" varchar(200) not null, "password_hash" varchar(100) null, "role" varchar(16) not null, "disabled" boolean not null default false, "customer_id" uuid null, "last_login_at" timestamptz null, "created_at" timestamptz not null, constraint "app_user_pkey" primary key ("id"));`);
    this.addSql(`alter table "app_user" add constraint "app_user_email_unique" unique ("email");`);
    this.addSql(`create index "app_user_shop_id_role_index" on "app_user" ("shop_id", "role");`);

    this.addSql(`create table "dyno_session" ("id" uuid not null, "shop_id" uuid not null, "bike_id" uuid not null, "started_at" timestamptz not null, "dyno_id" uuid null, "operator_id" uuid null, "ambient_temp_c" double precision null, "baro_kpa" double precision null, "humidity_pct" double precision null, "correction_standard" varchar(32) not null default 'sae-j1349', "notes" text null, "safety_confirmed_by_id" uuid null, "safety_confirmed_at" timestamptz null, "created_at" timestamptz not null, constraint "dyno_session_pkey" primary key ("id"));`);
    this.addSql(`create index "dyno_session_shop_id_bike_id_started_at_index" on "dyno_session" ("shop_id", "bike_id", "started_at");`);

    this.addSql(`create table "run" ("id" uuid not null, "shop_id" uuid not null, "bike_id" uuid not null, "session_id" uuid null, "stage_id" uuid null, "label" varchar(200) null, "sequence" int not null default 1, "raw_key" varchar(500) not null, "raw_sha256" varchar(64) not null, "raw_size_bytes" int not null, "original_name" varchar(300) not null, "content_type" varchar(120) null, "status" varchar(16) not null default 'failed', "mapping" jsonb null, "header_signature" varchar(500) null, "curve" jsonb null, "peak_power_hp" double precision null, "peak_power_rpm" double precision null, "peak_torque_lbft" double precision null, "peak_torque_rpm" double precision null, "rpm_min" double precision null, "rpm_max" double precision null, "points" int null, "identity_status" varchar(16) null, "max_deviation_pct" double precision null, "correction_standard" varchar(32) null, "correction_factor" double precision null, "conditions" jsonb null, "columns" jsonb null, "warnings" jsonb not null, "error" jsonb null, "tags" text[] not null default '{}', "note" text null, "uploaded_by_id" uuid null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "deleted_at" timestamptz null, constraint "run_pkey" primary key ("id"));`);
    this.addSql(`create index "run_shop_id_bike_id_created_at_index" on "run" ("shop_id", "bike_id", "created_at");`);
    this.addSql(`create index "run_shop_id_session_id_index" on "run" ("shop_id", "session_id");`);
    this.addSql(`create index "run_shop_id_stage_id_index" on "run" ("shop_id", "stage_id");`);
    this.addSql(`create index "run_shop_id_peak_power_hp_index" on "run" ("shop_id", "peak_power_hp");`);
    this.addSql(`alter table "run" add constraint "run_bike_id_raw_sha256_unique" unique ("bike_id", "raw_sha256");`);

    this.addSql(`create table "stage" ("id" uuid not null, "shop_id" uuid not null, "bike_id" uuid not null, "position" int not null default 0, "name" varchar(120) not null, "date" date null, "description" text null, "reference_run_id" uuid null, "gain_peak_power_hp" double precision null, "gain_peak_torque_lbft" double precision null, "gain_area_pct" double precision null, "gain_average_power_hp" double precision null, "total_cost_cents" int not null default 0, "created_at" timestamptz not null, constraint "stage_pkey" primary key ("id"));`);
    this.addSql(`create index "stage_shop_id_bike_id_position_index" on "stage" ("shop_id", "bike_id", "position");`);

    this.addSql(`create table "part" ("id" uuid not null, "shop_id" uuid not null, "stage_id" uuid not null, "category" varchar(32) not null, "description" text not null, "part_cost_cents" int not null default 0, "labour_cost_cents" int not null default 0, "head_work_level" varchar(32) null, "created_at" timestamptz not null, constraint "part_pkey" primary key ("id"));`);
    this.addSql(`create index "part_shop_id_category_head_work_level_index" on "part" ("shop_id", "category", "head_work_level");`);

    this.addSql(`create table "comparison" ("id" uuid not null, "shop_id" uuid not null, "name" varchar(200) not null, "bike_id" uuid not null, "baseline_run_id" uuid not null, "run_ids" jsonb not null, "options" jsonb not null, "note" text null, "created_by_id" uuid null, "created_at" timestamptz not null, constraint "comparison_pkey" primary key ("id"));`);
    this.addSql(`create index "comparison_shop_id_bike_id_index" on "comparison" ("shop_id", "bike_id");`);

    this.addSql(`create table "report" ("id" uuid not null, "shop_id" uuid not null, "bike_id" uuid not null, "comparison_id" uuid not null, "number" varchar(40) not null, "version" int not null default 1, "pdf_key" varchar(500) not null, "pdf_sha256" varchar(64) not null, "pdf_size_bytes" int not null, "technician_note" text null, "summary" jsonb null, "created_by_id" uuid null, "created_at" timestamptz not null, constraint "report_pkey" primary key ("id"));`);
    this.addSql(`create index "report_shop_id_bike_id_index" on "report" ("shop_id", "bike_id");`);
    this.addSql(`alter table "report" add constraint "report_shop_id_number_version_unique" unique ("shop_id", "number", "version");`);

    this.addSql(`create table "share_link" ("id" uuid not null, "shop_id" uuid not null, "report_id" uuid not null, "token_hash" varchar(64) not null, "expires_at" timestamptz not null, "revoked_at" timestamptz null, "view_count" int not null default 0, "last_viewed_at" timestamptz null, "created_by_id" uuid null, "created_at" timestamptz not null, constraint "share_link_pkey" primary key ("id"));`);
    this.addSql(`alter table "share_link" add constraint "share_link_token_hash_unique" unique ("token_hash");`);

    this.addSql(`create table "report_delivery" ("id" uuid not null, "shop_id" uuid not null, "report_id" uuid not null, "recipient" varchar(320) not null, "subject" varchar(300) not null, "message" text not null, "status" varchar(16) not null, "error" text null, "message_id" varchar(300) null, "sent_by_id" uuid null, "created_at" timestamptz not null, constraint "report_delivery_pkey" primary key ("id"));`);

    this.addSql(`create table "auth_token" ("id" uuid not null, "user_id" uuid not null, "purpose" varchar(16) not null, "token_hash" varchar(64) not null, "expires_at" timestamptz not null, "used_at" timestamptz null, "created_at" timestamptz not null, constraint "auth_token_pkey" primary key ("id"));`);
    this.addSql(`alter table "auth_token" add constraint "auth_token_token_hash_unique" unique ("token_hash");`);

    this.addSql(`create table "audit_entry" ("id" uuid not null, "shop_id" uuid not null, "user_id" uuid null, "action" varchar(60) not null, "entity_type" varchar(40) not null, "entity_id" varchar(64) not null, "details" jsonb null, "created_at" timestamptz not null, constraint "audit_entry_pkey" primary key ("id"));`);
    this.addSql(`create index "audit_entry_shop_id_created_at_index" on "audit_entry" ("shop_id", "created_at");`);

    this.addSql(`alter table "dyno" add constraint "dyno_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "customer" add constraint "customer_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "column_layout" add constraint "column_layout_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "bike" add constraint "bike_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "bike" add constraint "bike_customer_id_foreign" foreign key ("customer_id") references "customer" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "app_user" add constraint "app_user_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "app_user" add constraint "app_user_customer_id_foreign" foreign key ("customer_id") references "customer" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "dyno_session" add constraint "dyno_session_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "dyno_session" add constraint "dyno_session_bike_id_foreign" foreign key ("bike_id") references "bike" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "dyno_session" add constraint "dyno_session_dyno_id_foreign" foreign key ("dyno_id") references "dyno" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "dyno_session" add constraint "dyno_session_operator_id_foreign" foreign key ("operator_id") references "app_user" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "dyno_session" add constraint "dyno_session_safety_confirmed_by_id_foreign" foreign key ("safety_confirmed_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "run" add constraint "run_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "run" add constraint "run_bike_id_foreign" foreign key ("bike_id") references "bike" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "run" add constraint "run_session_id_foreign" foreign key ("session_id") references "dyno_session" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "run" add constraint "run_stage_id_foreign" foreign key ("stage_id") references "stage" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "run" add constraint "run_uploaded_by_id_foreign" foreign key ("uploaded_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "stage" add constraint "stage_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "stage" add constraint "stage_bike_id_foreign" foreign key ("bike_id") references "bike" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "stage" add constraint "stage_reference_run_id_foreign" foreign key ("reference_run_id") references "run" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "part" add constraint "part_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "part" add constraint "part_stage_id_foreign" foreign key ("stage_id") references "stage" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "comparison" add constraint "comparison_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "comparison" add constraint "comparison_bike_id_foreign" foreign key ("bike_id") references "bike" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "comparison" add constraint "comparison_baseline_run_id_foreign" foreign key ("baseline_run_id") references "run" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "comparison" add constraint "comparison_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "report" add constraint "report_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "report" add constraint "report_bike_id_foreign" foreign key ("bike_id") references "bike" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "report" add constraint "report_comparison_id_foreign" foreign key ("comparison_id") references "comparison" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "report" add constraint "report_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "share_link" add constraint "share_link_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "share_link" add constraint "share_link_report_id_foreign" foreign key ("report_id") references "report" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "share_link" add constraint "share_link_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "report_delivery" add constraint "report_delivery_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "report_delivery" add constraint "report_delivery_report_id_foreign" foreign key ("report_id") references "report" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "report_delivery" add constraint "report_delivery_sent_by_id_foreign" foreign key ("sent_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "auth_token" add constraint "auth_token_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "audit_entry" add constraint "audit_entry_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "audit_entry" add constraint "audit_entry_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete set null;`);
  }

}
