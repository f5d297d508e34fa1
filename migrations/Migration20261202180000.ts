import { Migration } from '@mikro-orm/migrations';

/**
 * Bay capture. device_token: one dyno's sync-agent key (only its SHA-256 stored). dyno.current_*:
 * what is strapped to the dyno now, and when its agent was last heard. inbox_item: files that
 * arrived with nothing on the dyno. dyno_session.conditions_to_confirm: a session started from the
 * bay with the shop's default conditions. run_notify: every insert or update of a run in a session
 * sends NOTIFY pullbook_run (delivered at commit, so listeners see only committed runs) for the
 * live bay board; any app instance listening gets it.
 */
export class Migration20261202180000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create table "device_token" ("id" uuid not null, "shop_id" uuid not null, "dyno_id" uuid not null, "name" varchar(100) not null, "token_hash" varchar(64) not null, "created_by_id" uuid null, "last_used_at" timestamptz null, "revoked_at" timestamptz null, "created_at" timestamptz not null, constraint "device_token_pkey" primary key ("id"));`);
    this.addSql(`alter table "device_token" add constraint "device_token_token_hash_unique" unique ("token_hash");`);
    this.addSql(`create index "device_token_shop_id_dyno_id_index" on "device_token" ("shop_id", "dyno_id");`);
    this.addSql(`alter table "device_token" add constraint "device_token_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "device_token" add constraint "device_token_dyno_id_foreign" foreign key ("dyno_id") references "dyno" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "device_token" add constraint "device_token_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "dyno" add column "current_bike_id" uuid null, add column "current_session_id" uuid null, add column "current_stage_id" uuid null, add column "current_set_at" timestamptz null, add column "agent_last_heard_at" timestamptz null;`);
    this.addSql(`alter table "dyno" add constraint "dyno_current_bike_id_foreign" foreign key ("current_bike_id") references "bike" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "dyno" add constraint "dyno_current_session_id_foreign" foreign key ("current_session_id") references "dyno_session" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "dyno" add constraint "dyno_current_stage_id_foreign" foreign key ("current_stage_id") references "stage" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "dyno_session" add column "conditions_to_confirm" boolean not null default false;`);

    this.addSql(`create table "inbox_item" ("id" uuid not null, "shop_id" uuid not null, "dyno_id" uuid null, "original_name" varchar(500) not null, "content_type" varchar(200) null, "raw_key" varchar(500) not null, "raw_sha256" varchar(64) not null, "size_bytes" int not null, "summary" jsonb not null, "repeats" int not null default 0, "assigned_at" timestamptz null, "assigned_by_id" uuid null, "run_ids" jsonb null, "created_at" timestamptz not null, constraint "inbox_item_pkey" primary key ("id"));`);
    this.addSql(`create index "inbox_item_shop_id_assigned_at_created_at_index" on "inbox_item" ("shop_id", "assigned_at", "created_at");`);
    // One waiting item per file content and shop: the same file sent again is answered as a duplicate.
    this.addSql(`create unique index "inbox_item_waiting_sha_unique" on "inbox_item" ("shop_id", "raw_sha256") where "assigned_at" is null;`);
    this.addSql(`alter table "inbox_item" add constraint "inbox_item_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "inbox_item" add constraint "inbox_item_dyno_id_foreign" foreign key ("dyno_id") references "dyno" ("id") on update cascade on delete set null;`);
    this.addSql(`alter table "inbox_item" add constraint "inbox_item_assigned_by_id_foreign" foreign key ("assigned_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`create or replace function pullbook_run_notify() returns trigger language plpgsql as $$
begin
  if NEW.session_id is not null then
    perform pg_notify('pullbook_run', json_build_object('shopId', NEW.shop_id, 'sessionId', NEW.session_id, 'runId', NEW.id, 'op', lower(TG_OP))::text);
  end if;
  if TG_OP = 'UPDATE' and OLD.session_id is not null and OLD.session_id is distinct from NEW.session_id then
    perform pg_notify('pullbook_run', json_build_object('shopId', OLD.shop_id, 'sessionId', OLD.session_id, 'runId', OLD.id, 'op', 'moved')::text);
  end if;
  return null;
end $$;`);
    this.addSql(`create trigger "run_notify" after insert or update on "run" for each row execute function pullbook_run_notify();`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop trigger if exists "run_notify" on "run";`);
    this.addSql(`drop function if exists pullbook_run_notify();`);
    this.addSql(`drop table if exists "inbox_item";`);
    this.addSql(`alter table "dyno_session" drop column "conditions_to_confirm";`);
    this.addSql(`alter table "dyno" drop column "current_bike_id", drop column "current_session_id", drop column "current_stage_id", drop column "current_set_at", drop column "agent_last_heard_at";`);
    this.addSql(`drop table if exists "device_token";`);
  }
}
