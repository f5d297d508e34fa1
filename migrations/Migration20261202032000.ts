import { Migration } from '@mikro-orm/migrations';

/** comparison.color_slots: each run's colour slot at save time (comparison.entity.ts). */
export class Migration20261202032000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`alter table "comparison" add column "color_slots" jsonb null;`);
  }

  override async down(): Promise<void> {
    this.addSql(`alter table "comparison" drop column "color_slots";`);
  }
}
