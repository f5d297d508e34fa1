import { Migration } from '@mikro-orm/migrations';

/**
 * build_index.parts_trgm: the trigram set pg_trgm extracts from parts_text, as sorted integers,
 * so "similar builds" (server/modules/builds/build-similar.service.ts) computes the parts-text
 * similarity by merging two stored integer arrays (intarray's & and icount) instead of having
 * similarity() extract both texts' trigrams again for every pair.
 *
 * trgm_codes(text) encodes each trigram show_trgm prints as the 3 bytes pg_trgm compares:
 * three printable ASCII characters as (b1 << 16) | (b2 << 8) | b3, and the others, printed as
 * "0x" and 6 hex digits (multibyte characters, which pg_trgm hashes to 3 bytes), as those bytes.
 * The set is pg_trgm's own, so |A ∩ B| / (|A| + |B| − |A ∩ B|) is its similarity, except that
 * similarity() rounds the figure to single precision. A generated column: build_index_refresh and
 * every backfill fill it without change.
 *
 * intarray's operators apply to int4[] only; the other array columns here are text[]. intarray
 * is a trusted extension (PostgreSQL 13+), though some managed services want it allow-listed
 * first. Adding the stored column rewrites build_index under an exclusive lock (writes that
 * refresh it wait), so on a large archive run this migration outside shop hours. Needs
 * PostgreSQL 14+ (begin atomic).
 */
export class Migration20261202031000 extends Migration {
  override async up(): Promise<void> {
    this.addSql(`create extension if not exists intarray;`);
    // A standard SQL body (begin atomic): show_trgm is resolved now, wherever pg_trgm is
    // installed, and the function is recorded as depending on it.
    this.addSql(`create or replace function trgm_codes(t text) returns int[] language sql immutable strict parallel safe
      begin atomic
        select coalesce(array_agg(code order by code), '{}') from (
          select case when length(g) = 3 then (ascii(substr(g, 1, 1)) << 16) | (ascii(substr(g, 2, 1)) << 8) | ascii(substr(g, 3, 1))
                      else ('x' || lpad(substr(g, 3), 8, '0'))::bit(32)::int end as code
            from unnest(show_trgm(t)) g) s;
      end;`);
    this.addSql(`alter table "build_index" add column "parts_trgm" int[] generated always as (trgm_codes("parts_text")) stored;`);
  }

  override async down(): Promise<void> {
    this.addSql(`alter table "build_index" drop column "parts_trgm";`);
    this.addSql(`drop function if exists trgm_codes(text);`);
  }
}
