import type { EntityManager } from '@mikro-orm/postgresql';
import { PART_CATEGORY_LABELS, type PartCategory } from '@shared/parts';
import type { Actor } from '../../http/actor';
import { notFound } from '../../lib/errors';
import type { SimilarBuildsDto } from '@shared/schemas/builds';
import { wholePage } from '@shared/schemas/common';
import { BUILD_INDEX_COLUMNS, Sql, toBuildItem, type BuildIndexRow } from './build-sql';
import { preparedQuery, preparedStatement } from '../../db/prepared-query';

const ME = preparedStatement(`select b.id, b.engine_family, b.displacement_cc, b.cylinders, coalesce(l.categories, '{}') as cats, coalesce(l.parts_trgm, '{}') as trgm
       from bike b left join lateral (select categories, parts_trgm from build_index where bike_id = b.id order by stage_position desc limit 1) l on true
      where b.id = ? and b.shop_id = ?`);

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
 * - T, parts text: pg_trgm's trigram similarity |A ∩ B| / |A ∪ B| of all this bike's part
 *   descriptions joined and the other build's cumulative part descriptions joined, from the
 *   trigram sets build_index keeps (parts_trgm, Migration20261202031000) — the same sets
 *   similarity() extracts, without extracting them again for every pair.
 *
 * Candidates are other bikes of the shop whose engine family is trigram-similar (`%`, threshold
 * 0.3) or whose displacement is within ±20 % (when this bike has neither, every bike), at every
 * measured stage. For speed at archive scale only the 200 candidate bikes with the highest
 * 0.4·E + 0.3·D are scored in full (the part terms can add at most 0.3, so a bike outside them
 * can only outrank one inside when that many bikes tie closely on engine and size; among tied
 * bikes the most recently added go first, as recent builds reflect the parts and practice the
 * shop uses now). Reasons name what matched: "same engine family" (E = 1, case ignored), "similar
 * engine family (X)" (E ≥ 0.5), "within 5 % displacement" / "within 10 % displacement" /
 * "within 20 % displacement", "same cylinder count", "also has: camshaft, cylinder heads", "similar
 * parts descriptions" (T ≥ 0.3).
 */
/** Bikes pre-ranked by engine family and displacement before the part terms are computed. */
export const SIMILAR_CANDIDATE_BIKES = 200;

export const SIMILARITY_WEIGHTS = { engineFamily: 0.4, displacement: 0.3, partCategories: 0.2, partsText: 0.1 } as const;

interface SimilarRow extends BuildIndexRow {
  e: number;
  d: number;
  c: number;
  t: number;
  similarity: number;
  categories: PartCategory[];
  shared?: PartCategory[];
  same_family: boolean;
  same_cylinders: boolean;
  cc_rel: number | null;
}

export async function similarBuilds(em: EntityManager, actor: Actor, bikeId: string, limit: number): Promise<SimilarBuildsDto> {
  const q = new Sql();
  const shop = actor.shopId;
  // This bike and its whole build (the cumulative build of its last stage).
  const [me] = (await preparedQuery(em, ME, [bikeId, shop])) as { id: string; engine_family: string | null; displacement_cc: number | null; cylinders: number | null; cats: PartCategory[]; trgm: number[] }[];
  if (!me) throw notFound('Bike');
  const myCats = new Set(me.cats);
  const w = SIMILARITY_WEIGHTS;
  const fam = me.engine_family;
  const cc = me.displacement_cc !== null && me.displacement_cc > 0 ? me.displacement_cc : null;
  // Candidate bikes: indexed conditions only — the trigram `%` is decided once per engine family of
  // the shop (build_family), the displacement range by btree. Each piece is a function so its
  // placeholders are taken in text order.
  const candidate = () => {
    const c: string[] = [];
    if (fam !== null) c.push('fam.engine_family is not null');
    if (me.displacement_cc !== null) c.push(`b.displacement_cc between ${q.p(me.displacement_cc * 0.8)} and ${q.p(me.displacement_cc * 1.2)}`);
    if (fam === null && me.displacement_cc === null) c.push('true');
    return c.join(' or ');
  };
  const famCte = () =>
    fam === null
      ? `fam as (select null::varchar as engine_family, 0::float8 as e where false)`
      : `fam as materialized (
          select f.engine_family, similarity(f.engine_family, ${q.p(fam)})::float8 as e
            from build_family f where f.shop_id = ${q.p(shop)} and f.engine_family % ${q.p(fam)})`;
  // |A ∩ B| with this bike's categories as constants: one containment test per category.
  const sharedCount = () => (myCats.size ? [...myCats].map((c) => `(bi.categories @> array[${q.p(c)}]::text[])::int`).join(' + ') : '0');
  const e = () => (fam === null ? '0' : `coalesce(fam.e, similarity(b.engine_family, ${q.p(fam)}), 0)`);
  const d = () => (cc === null ? '0' : `case when b.displacement_cc is null then 0 else greatest(0, 1 - abs(b.displacement_cc - ${q.p(cc)}) / (0.2 * ${q.p(cc)})) end`);
  const ccRel = () => (cc === null ? 'null' : `abs(b.displacement_cc - ${q.p(cc)}) / ${q.p(cc)}`);
  const sameFamily = () => (fam === null ? 'false' : `(lower(b.engine_family) = lower(${q.p(fam)})) is true`);
  const sameCyl = () => (me.cylinders === null ? 'false' : `(b.cylinders = ${q.p(me.cylinders)}) is true`);
  const sql = `
    with mine as (select ${q.p(me.trgm)}::int[] as trgm),
    ${famCte()},
    bike_score as (
      select b.id, b.created_at, ${e()}::float8 as e, ${d()}::float8 as d, ${ccRel()}::float8 as cc_rel, ${sameFamily()} as same_family, ${sameCyl()} as same_cylinders
        from bike b left join fam on fam.engine_family = b.engine_family
       where b.shop_id = ${q.p(shop)} and b.id <> ${q.p(me.id)} and (${candidate()})),
    cand_bike as (
      select * from bike_score order by ${w.engineFamily} * e + ${w.displacement} * d desc, created_at desc, id limit ${q.p(SIMILAR_CANDIDATE_BIKES)}),
    cand as (
      select bi.stage_id, cb.e, cb.d, cb.cc_rel, cb.same_family, cb.same_cylinders,
             ${sharedCount()} as n_shared, cardinality(bi.categories) + ${q.p(myCats.size)} as sizes,
             icount(bi.parts_trgm & mine.trgm) as t_shared, icount(bi.parts_trgm) + icount(mine.trgm) as t_sizes
        from cand_bike cb join build_index bi on bi.bike_id = cb.id and bi.gain_peak_power_hp is not null cross join mine),
    scored as (
      -- Both category lists and both trigram lists are sets, so |A ∪ B| = |A| + |B| − |A ∩ B|.
      select cand.*, coalesce(n_shared::float8 / nullif(sizes - n_shared, 0), 0) as c, coalesce(t_shared::float8 / nullif(t_sizes - t_shared, 0), 0) as t from cand),
    top as (
      select scored.*, (${w.engineFamily} * e + ${w.displacement} * d + ${w.partCategories} * c + ${w.partsText} * t)::float8 as similarity from scored
       order by similarity desc, stage_id desc limit ${q.p(limit)})
    select ${BUILD_INDEX_COLUMNS}, c.name as customer_name, top.e, top.d, top.c, top.t, top.similarity, bi.categories, top.same_family, top.same_cylinders, top.cc_rel
      from top join build_index bi on bi.stage_id = top.stage_id join customer c on c.id = bi.customer_id
     order by top.similarity desc, top.stage_id desc`;
  // Prepared: the text varies only with which of this bike's fields are known (engine family;
  // displacement unknown, zero or known; cylinders) and how many part categories it has (0–9):
  // at most 2 · 3 · 2 · 10 = 120 texts.
  const rows = (await preparedQuery(em, preparedStatement(sql), q.params)) as SimilarRow[];
  const items = rows.map((r) => ({
      ...toBuildItem(r, r.parts),
      score: r.similarity,
      similarity: r.similarity,
      components: { engineFamily: r.e, displacement: r.d, partCategories: r.c, partsText: r.t },
      reasons: reasonsFor({ ...r, shared: r.categories.filter((c) => myCats.has(c)).sort() }),
  }));
  return { bikeId, weights: { ...w }, ...wholePage(items) };
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
