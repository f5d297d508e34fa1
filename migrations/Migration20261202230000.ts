import { Migration } from '@mikro-orm/migrations';

/**
 * Invitations to addresses that already sign in at another shop (server/modules/users
 * pending-invite.entity.ts): kept per shop so the inviting shop sees them like any other pending
 * invitation, and a reload does not reveal that the address is known elsewhere.
 */
export class Migration20261202230000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create table "pending_invite" ("id" uuid not null, "shop_id" uuid not null, "created_at" timestamptz not null, "email" varchar(320) not null, "name" varchar(200) not null, "role" varchar(16) not null, "disabled" boolean not null default false, "customer_id" uuid null, constraint "pending_invite_pkey" primary key ("id"));`);
    this.addSql(`alter table "pending_invite" add constraint "pending_invite_shop_id_email_unique" unique ("shop_id", "email");`);
    this.addSql(`alter table "pending_invite" add constraint "pending_invite_shop_id_foreign" foreign key ("shop_id") references "shop" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "pending_invite" add constraint "pending_invite_customer_id_foreign" foreign key ("customer_id") references "customer" ("id") on update cascade on delete set null;`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "pending_invite" cascade;`);
  }
}
