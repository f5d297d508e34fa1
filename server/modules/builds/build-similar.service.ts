import type { EntityManager } from '@mikro-orm/postgresql';
import { PART_CATEGORY_LABELS, type PartCategory } from '@shared/parts';
import type { Actor } from '../../http/actor';
import { notFound } from '../../lib/errors';
import type { SimilarBuildsDto } from '@shared/schemas/builds';
import { BUILD_COLUMNS, Sql, cumulativeParts, toBuildItem, type BuildRow } from './build-sql';

/**
 * "Similar to this bike": other builds of the same shop ranked by a weighted similarity
 *
 *   similarity = 0.40 · E + 0.30 · D + 0.20 · C + 0.10 · T      (each component 0…1)
 *
 * - E, engine family: pg_trgm similarity(this bike's engine family, theirs) — 1 for the same
 *   spelling, lower for near spellings ("Vantor 103" vs "Vantor 107"), 0 when either is unknown.
 * - D, displacement closeness: max(0, 1 − |Δcc| / (0.20 · this bike's cc)) — 1 for the same size,
 *   falling linearly to 0 at ±20 %; 0 when either is unknown.
 * - C, shared part categories: Jaccard index |A ∩ B| / |A ∪ B| of the categories fitted to this
 *   bike (all its stages) and those of the other build (cumulative, up to that stage); 0 when both
 *   are empty.
 * - T, parts text: pg_trgm similarity of all this bike's part descriptions joined and the other
 *   build's cumulative part descriptions joined.
 *
 * Candidates are other bikes of the shop whose engine family is trigram-similar (`%`, threshold
 * 0.3) or whose displacement is within ±20 % (when this bike has neither, every bike), at every
 * measured stage. For speed at archive scale only the 200 candidate bikes with the highest
 * 0.4·E + 0.3·D are scored in full (the part terms can add at most 0.3, so a bike outside them
 * can only outrank one inside when that many bikes tie closely on engine and size). Reasons name what matched: "same engine family" (E = 1, case ignored), "similar
 * engine family (X)" (E ≥ 0.5), "within 5 % displacement" / "within 10 % displacement" /
 * "within 20 % displacement", "same cylinder count", "also has: camshaft, cylinder heads", "similar
 * parts descriptions" (T ≥ 0.3).
 */
/** Bikes pre-ranked by engine family and displacement before the part terms are computed. */
export const SIMILAR_CANDIDATE_BIKES = 200;

export const SIMILARITY_WEIGHTS = { engineFamily: 0.4, displacement: 0.3, partCategories: 0.2, partsText: 0.1 } as const;

interface SimilarRow extends BuildRow {
  e: number;
  d: number;
  c: number;
  t: number;
  similarity: number;
  shared: PartCategory[] | null;
  same_family: boolean;
  same_cylinders: boolean;
  cc_rel: number | null;
}

export async function similarBuilds(em: EntityManager, actor: Actor, bikeId: string, limit: number): Promise<SimilarBuildsDto> {
  const q = new Sql();
  const shop = actor.shopId;
  const [me] = (await em.getConnection().execute(`select id from bike where id = ? and shop_id = ?`, [bikeId, shop])) as { id: string }[];
  if (!me) throw notFound('Bike');
  const w = SIMILARITY_WEIGHTS;
  const sql = `
    with me as (select id, engine_family, displacement_cc, cylinders from bike where id = ${q.p(bikeId)} and shop_id = ${q.p(shop)}),
    my_parts as (
      select coalesce(array_agg(distinct p.category), '{}') as cats, coalesce(string_agg(p.description, ' ' order by ps.position, p.description), '') as txt
        from stage ps join part p on p.stage_id = ps.id where ps.bike_id = ${q.p(bikeId)} and ps.shop_id = ${q.p(shop)}),
    all_bikes as (
      select b.id,
             coalesce(similarity(b.engine_family, me.engine_family), 0)::float8 as e,
             case when b.displacement_cc is null or me.displacement_cc is null or me.displacement_cc <= 0 then 0
                  else greatest(0, 1 - abs(b.displacement_cc - me.displacement_cc) / (0.2 * me.displacement_cc)) end::float8 as d,
             case when b.displacement_cc is null or me.displacement_cc is null or me.displacement_cc <= 0 then null
                  else abs(b.displacement_cc - me.displacement_cc) / me.displacement_cc end::float8 as cc_rel,
             (lower(b.engine_family) = lower(me.engine_family)) is true as same_family,
             (b.cylinders = me.cylinders) is true as same_cylinders
        from bike b, me
       where b.shop_id = ${q.p(shop)} and b.id <> me.id
         and (b.engine_family % me.engine_family
              or b.displacement_cc between me.displacement_cc * 0.8 and me.displacement_cc * 1.2
              or (me.engine_family is null and me.displacement_cc is null))
),
    cand_bike as (
      select * from all_bikes order by ${w.engineFamily} * e + ${w.displacement} * d desc, id limit ${q.p(SIMILAR_CANDIDATE_BIKES)}),
    cand as (
      select ${BUILD_COLUMNS}, cb.e, cb.d, cb.cc_rel, cb.same_family, cb.same_cylinders, cum.cats, cum.txt
        from cand_bike cb
        join bike b on b.id = cb.id
        join customer c on c.id = b.customer_id
        join stage s on s.bike_id = cb.id and s.gain_peak_power_hp is not null
        cross join lateral (
          select coalesce(array_agg(distinct p.category), '{}') as cats, coalesce(string_agg(p.description, ' ' order by ps.position, p.description), '') as txt
            from stage ps join part p on p.stage_id = ps.id
           where ps.bike_id = s.bike_id and ps.position <= s.position) cum),
    scored as (
      select cand.*,
             array(select unnest(cand.cats) intersect select unnest(my_parts.cats) order by 1) as shared,
             coalesce(cardinality(array(select unnest(cand.cats) intersect select unnest(my_parts.cats)))::float8
                      / nullif(cardinality(array(select unnest(cand.cats) union select unnest(my_parts.cats))), 0), 0) as c,
             case when cand.txt = '' or my_parts.txt = '' then 0 else similarity(cand.txt, my_parts.txt) end::float8 as t
        from cand, my_parts)
    select scored.*, (${w.engineFamily} * e + ${w.displacement} * d + ${w.partCategories} * c + ${w.partsText} * t)::float8 as similarity
      from scored
     order by similarity desc, stage_id desc
     limit ${q.p(limit)}`;
  const rows = (await em.getConnection().execute(sql, q.params)) as SimilarRow[];
  const parts = await cumulativeParts(em, shop, rows.map((r) => r.stage_id));
  return {
    bikeId,
    weights: { ...w },
    items: rows.map((r) => ({
      ...toBuildItem(r, parts.get(r.stage_id) ?? []),
      score: r.similarity,
      similarity: r.similarity,
      components: { engineFamily: r.e, displacement: r.d, partCategories: r.c, partsText: r.t },
      reasons: reasonsFor(r),
    })),
  };
}

function reasonsFor(r: SimilarRow): string[] {
  const reasons: string[] = [];
  if (r.same_family) reasons.push('same engine family');
  else if (r.e >= 0.5 && r.engine_family) reasons.push(`similar engine family (${r.engine_family})`);
  if (r.cc_rel !== null) {
    // A hair of tolerance so 5.000 % counts as "within 5 %".
    if (r.cc_rel <= 0.05 + 1e-9) reasons.push('within 5 % displacement');
    else if (r.cc_rel <= 0.1 + 1e-9) reasons.push('within 10 % displacement');
    else if (r.cc_rel <= 0.2 + 1e-9) reasons.push('within 20 % displacement');
  }
  if (r.same_cylinders) reasons.push('same cylinder count');
  if (r.shared && r.shared.length) reasons.push(`also has: ${r.shared.map((c) => PART_CATEGORY_LABELS[c]?.toLowerCase() ?? c).join(', ')}`);
  if (r.t >= 0.3) reasons.push('similar parts descriptions');
  return reasons;
}
