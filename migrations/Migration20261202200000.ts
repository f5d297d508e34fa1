import { Migration } from '@mikro-orm/migrations';

/**
 * The mail send log and sign-in throttling, both read and written with SQL (no ORM entities).
 *
 * mail_message: one row per outgoing e-mail, written in the transaction of the change that causes
 * it (invitation, reset, report). `message_key` is unique, so a message is queued once; a worker
 * claims a row by moving it from queued to sending in one guarded UPDATE, so two app instances
 * never send the same row. The body (which may hold a one-time link) is cleared once the row is
 * sent or failed. share_link_id: the share link a report e-mail carries, removed if the send fails.
 *
 * object_write: an object write that started (journaled before the object is stored), so an
 * object whose row never committed because the process died is found and removed by the
 * reconciliation (modules/runs/orphan-reconcile.ts) once the write is old enough.
 *
 * login_throttle: failed sign-ins per account, per account and client address, and per address,
 * with the time of the last failure (for the exponential delay), plus the pairs that signed in
 * successfully (kind 'known'), which skip the account-wide cap.
 */
export class Migration20261202200000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create table "mail_message" (
      "id" uuid not null default gen_random_uuid() primary key,
      "shop_id" uuid null references "shop" ("id") on delete cascade,
      "message_key" varchar(200) not null unique,
      "kind" varchar(32) not null,
      "recipient" varchar(320) not null,
      "subject" varchar(300) not null,
      "body" jsonb null,
      "status" varchar(16) not null default 'queued' check ("status" in ('queued', 'sending', 'sent', 'failed')),
      "attempts" int not null default 0,
      "last_error" text null,
      "next_attempt_at" timestamptz not null default now(),
      "claimed_at" timestamptz null,
      "job_enqueued_at" timestamptz null,
      "sent_at" timestamptz null,
      "provider_message_id" varchar(300) null,
      "share_link_id" uuid null references "share_link" ("id") on delete set null,
      "report_delivery_id" uuid null references "report_delivery" ("id") on delete set null,
      "created_at" timestamptz not null default now(),
      "updated_at" timestamptz not null default now());`);
    this.addSql(`create index "mail_message_status_next_index" on "mail_message" ("status", "next_attempt_at");`);
    this.addSql(`create index "mail_message_shop_created_index" on "mail_message" ("shop_id", "created_at" desc);`);
    this.addSql(`create table "object_write" ("key" varchar(500) not null primary key, "started_at" timestamptz not null default now());`);
    this.addSql(`create table "login_throttle" (
      "key" varchar(400) not null primary key,
      "failures" int not null default 0,
      "window_start" timestamptz not null default now(),
      "last_at" timestamptz not null default now());`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "mail_message";`);
    this.addSql(`drop table if exists "login_throttle";`);
    this.addSql(`drop table if exists "object_write";`);
  }
}
