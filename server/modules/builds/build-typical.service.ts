import type { EntityManager } from '@mikro-orm/postgresql';
import { HEAD_WORK_LABELS, PART_CATEGORY_LABELS } from '@shared/parts';
import type { Actor } from '../../http/actor';
import { notFound } from '../../lib/errors';
import type { TypicalQuery } from '@shared/schemas/builds';
import type { TypicalBuildDto, TypicalOutcomeDto } from '@shared/schemas/builds';
import { Sql } from './build-sql';
import { QUANTILE_METHOD } from './stats';
import { MIN_CONFIDENT_BUILDS, TYPICAL_DISCLAIMER, outcomeMessage, summarizeOutcome } from './outcome-engine';

export { MIN_CONFIDENT_BUILDS, TYPICAL_DISCLAIMER };
/** Engine families at least this trigram-similar count as "the same kind of engine". */
export const TYPICAL_FAMILY_SIMILARITY = 0.5;
/** Displacement within ± this fraction of the planned bike's. */
export const TYPICAL_DISPLACEMENT_TOLERANCE = 0.15;

/** The bike a modification is planned for, as the similarity rules read it. */
export interface PlannedBike {
  id: string;
  shopId: string;
  engine_family: string | null;
  displacement_cc: number | null;
}

export async function plannedBike(em: EntityManager, shopId: string, bikeId: string): Promise<PlannedBike> {
  const [me] = (await em.getConnection().execute(`select id, engine_family, displacement_cc from bike where id = ? and shop_id = ?`, [bikeId, shopId])) as Omit<PlannedBike, 'shopId'>[];
  if (!me) throw notFound('Bike');
  return { ...me, shopId };
}

/** How "similar builds" are chosen, in words. */
export function similarityCriteria(me: PlannedBike): string {
  const criteria = [
    me.engine_family ? `engine family like “${me.engine_family}”` : null,
    me.displacement_cc ? `displacement within ±${TYPICAL_DISPLACEMENT_TOLERANCE * 100} % of ${Math.round(me.displacement_cc)} cm³` : null,
  ].filter(Boolean).join(' and ');
  return criteria || 'none (no engine family or displacement on record)';
}

/** The part key a category (and head-work level) is indexed under in build_index.own_part_keys. */
export const partKey = (category: string, level: string | null | undefined) => (category === 'cylinder-heads' && level ? `${category}:${level}` : category);

export function partKeyLabel(key: string): string {
  const [category, level] = key.split(':') as [keyof typeof PART_CATEGORY_LABELS, (keyof typeof HEAD_WORK_LABELS)?];
  return `${PART_CATEGORY_LABELS[category] ?? category}${level ? `: ${HEAD_WORK_LABELS[level] ?? level}` : ''}`;
}

/**
 * Similar builds that added every one of `keys` in one stage, with that stage's increment.
 *
 * Similar builds: other bikes of the shop whose engine family is trigram-similar to this bike's
 * (pg_trgm similarity ≥ 0.5) when this bike has one, and whose displacement is within ±15 % when
 * this bike has one (at least one of the two must be known; `comparable` is false otherwise).
 *
 * On each such bike, the stage where the modification was added is the lowest-positioned stage
 * whose own parts include every key (a key is a category, or 'cylinder-heads:<level>' for that
 * head-work level). Bikes where that stage was not measured are left out.
 *
 * Gains are per-stage increments: that stage's gain against the baseline minus the gain of the
 * nearest earlier measured stage (0 when the earlier stage is the baseline). So "+9 hp" means
 * the step that added the modification measured 9 hp more than the step before it; other parts
 * fitted in the same stage are included in that step. Cost = that stage's own parts and labour.
 */
export async function buildsThatAdded(em: EntityManager, me: PlannedBike, keys: readonly string[]): Promise<{ comparable: boolean; builds: TypicalBuildDto[] }> {
  const q = new Sql();
  // Placeholders are positional: the similarity conditions collect their own values (cond), placed in text order below.
  const cond = new Sql();
  const conditions: string[] = [];
  if (me.engine_family) conditions.push(`similarity(bi.engine_family, ${cond.p(me.engine_family)}) >= ${TYPICAL_FAMILY_SIMILARITY}`);
  if (me.displacement_cc) {
    conditions.push(`bi.displacement_cc between ${cond.p(me.displacement_cc * (1 - TYPICAL_DISPLACEMENT_TOLERANCE))} and ${cond.p(me.displacement_cc * (1 + TYPICAL_DISPLACEMENT_TOLERANCE))}`);
  }
  if (!conditions.length || !keys.length) return { comparable: conditions.length > 0, builds: [] };
  // build_index.own_part_keys: this stage's own categories, and 'category:level' for head work.
  const sql = `
    with added as (
      select distinct on (bi.bike_id) bi.*
        from build_index bi
       where bi.shop_id = ${q.p(me.shopId)} and bi.bike_id <> ${q.p(me.id)} and ${q.embed(cond, conditions.join(' and '))}
         and bi.own_part_keys @> array[${q.list(keys)}]::text[]
       order by bi.bike_id, bi.stage_position, bi.stage_id)
    select a.stage_id, a.bike_id, a.stage_name, to_char(a.stage_date, 'YYYY-MM-DD') as stage_date, a.total_cost_cents,
           a.make, a.model, a.engine_family, a.displacement_cc,
           (a.gain_peak_power_hp - coalesce(a.prev_gain_peak_power_hp, 0))::float8 as peak_inc,
           (a.gain_average_power_hp - coalesce(a.prev_gain_average_power_hp, 0))::float8 as avg_inc
      from added a
     where a.gain_peak_power_hp is not null
     order by peak_inc desc, a.stage_id`;
  const rows = (await em.getConnection().execute(sql, q.params)) as {
    stage_id: string; bike_id: string; stage_name: string; stage_date: string; total_cost_cents: number;
    make: string; model: string; engine_family: string | null; displacement_cc: number | null; peak_inc: number; avg_inc: number | null;
  }[];
  return {
    comparable: true,
    builds: rows.map((r) => ({
      bikeId: r.bike_id,
      stageId: r.stage_id,
      make: r.make,
      model: r.model,
      engineFamily: r.engine_family,
      displacementCc: r.displacement_cc,
      stageName: r.stage_name,
      date: r.stage_date,
      peakPowerGainHp: r.peak_inc,
      averagePowerGainHp: r.avg_inc,
      costCents: r.total_cost_cents,
    })),
  };
}

/**
 * What a planned modification added on similar builds (see buildsThatAdded for the rules).
 * Statistics: count, median, first and third quartiles (interquartile range), min and max, with
 * quantiles by Hyndman & Fan type 7 (R-7, linear interpolation). A build plan's prediction for a
 * one-category plan is this same computation (plans/plan-prediction.ts).
 */
export async function typicalOutcome(em: EntityManager, actor: Actor, query: TypicalQuery): Promise<TypicalOutcomeDto> {
  const me = await plannedBike(em, actor.shopId, query.bikeId);
  const level = query.category === 'cylinder-heads' ? (query.level ?? null) : null;
  const key = partKey(query.category, level);
  const { comparable, builds } = await buildsThatAdded(em, me, [key]);
  const summary = summarizeOutcome(builds);
  return {
    bikeId: me.id,
    category: query.category,
    level,
    criteria: similarityCriteria(me),
    ...summary,
    message: outcomeMessage(summary, partKeyLabel(key), comparable),
    disclaimer: TYPICAL_DISCLAIMER,
    quantileMethod: QUANTILE_METHOD,
    builds,
  };
}
