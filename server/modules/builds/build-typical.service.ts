import type { EntityManager } from '@mikro-orm/postgresql';
import { HEAD_WORK_LABELS, PART_CATEGORY_LABELS } from '@shared/parts';
import type { Actor } from '../../http/actor';
import { notFound } from '../../lib/errors';
import type { TypicalQuery } from '@shared/schemas/builds';
import type { TypicalBuildDto, TypicalOutcomeDto } from '@shared/schemas/builds';
import { Sql } from './build-sql';
import { QUANTILE_METHOD, fiveNumbers, quantileR7 } from './stats';

/** Fewer builds than this and the figure is flagged as weak. */
export const MIN_CONFIDENT_BUILDS = 5;
/** Engine families at least this trigram-similar count as "the same kind of engine". */
export const TYPICAL_FAMILY_SIMILARITY = 0.5;
/** Displacement within ± this fraction of the planned bike's. */
export const TYPICAL_DISPLACEMENT_TOLERANCE = 0.15;

export const TYPICAL_DISCLAIMER = 'Past results measured on similar builds in this shop — not a promise of what this bike will make.';

/**
 * What a planned modification added on similar builds.
 *
 * Similar builds: other bikes of the shop whose engine family is trigram-similar to this bike's
 * (pg_trgm similarity ≥ 0.5) when this bike has one, and whose displacement is within ±15 % when
 * this bike has one (at least one of the two must be known).
 *
 * On each such bike, the stage where the modification was added is the lowest-positioned stage
 * whose own parts include the category (with exactly that head-work level when `level` is given).
 * Bikes where that stage was not measured are left out.
 *
 * Gains are per-stage increments: that stage's gain against the baseline minus the gain of the
 * nearest earlier measured stage (0 when the earlier stage is the baseline). So "+9 hp" means
 * the step that added the modification measured 9 hp more than the step before it; other parts
 * fitted in the same stage are included in that step.
 *
 * Statistics: count, median, first and third quartiles (interquartile range), min and max, with
 * quantiles by Hyndman & Fan type 7 (R-7, linear interpolation); cost = that stage's own parts
 * and labour.
 */
export async function typicalOutcome(em: EntityManager, actor: Actor, query: TypicalQuery): Promise<TypicalOutcomeDto> {
  const shop = actor.shopId;
  const [me] = (await em.getConnection().execute(
    `select id, engine_family, displacement_cc from bike where id = ? and shop_id = ?`,
    [query.bikeId, shop],
  )) as { id: string; engine_family: string | null; displacement_cc: number | null }[];
  if (!me) throw notFound('Bike');
  const level = query.category === 'cylinder-heads' ? (query.level ?? null) : null;

  const q = new Sql();
  // Placeholders are positional: the similarity conditions collect their own values (cond), placed in text order below.
  const cond = new Sql();
  const conditions: string[] = [];
  if (me.engine_family) conditions.push(`similarity(bi.engine_family, ${cond.p(me.engine_family)}) >= ${TYPICAL_FAMILY_SIMILARITY}`);
  if (me.displacement_cc) {
    conditions.push(`bi.displacement_cc between ${cond.p(me.displacement_cc * (1 - TYPICAL_DISPLACEMENT_TOLERANCE))} and ${cond.p(me.displacement_cc * (1 + TYPICAL_DISPLACEMENT_TOLERANCE))}`);
  }
  const what = `${PART_CATEGORY_LABELS[query.category]}${level ? `: ${HEAD_WORK_LABELS[level]}` : ''}`;
  const criteria = [
    me.engine_family ? `engine family like “${me.engine_family}”` : null,
    me.displacement_cc ? `displacement within ±${TYPICAL_DISPLACEMENT_TOLERANCE * 100} % of ${Math.round(me.displacement_cc)} cm³` : null,
  ].filter(Boolean).join(' and ');

  let builds: TypicalBuildDto[] = [];
  if (conditions.length) {
    // build_index.own_part_keys: this stage's own categories, and 'category:level' for head work.
    const key = level ? `${query.category}:${level}` : query.category;
    const sql = `
      with added as (
        select distinct on (bi.bike_id) bi.*
          from build_index bi
         where bi.shop_id = ${q.p(shop)} and bi.bike_id <> ${q.p(me.id)} and ${q.embed(cond, conditions.join(' and '))}
           and bi.own_part_keys @> array[${q.p(key)}]::text[]
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
    builds = rows.map((r) => ({
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
    }));
  }

  const count = builds.length;
  const peak = fiveNumbers(builds.map((b) => b.peakPowerGainHp));
  const avg = fiveNumbers(builds.map((b) => b.averagePowerGainHp).filter((v): v is number => v !== null));
  const costs = builds.map((b) => b.costCents).sort((a, b) => a - b);
  const lowConfidence = count < MIN_CONFIDENT_BUILDS;
  const fmt = (n: number) => `${n >= 0 ? '+' : '−'}${Math.abs(n).toFixed(1)} hp`;
  let message: string;
  if (!conditions.length) message = 'This bike has no engine family or displacement on record, so there is nothing to compare it with.';
  else if (count === 0) message = `No similar build in this shop has had ${what.toLowerCase()} measured yet.`;
  else {
    const range = peak ? `${fmt(peak.q1)} to ${fmt(peak.q3)} at peak (middle half), median ${fmt(peak.median)}` : '';
    message = lowConfidence
      ? `Only ${count} similar build${count === 1 ? '' : 's'} had ${what.toLowerCase()} measured — too few to call typical; treat ${range} as a rough guide.`
      : `${count} similar builds had ${what.toLowerCase()} measured: ${range}.`;
  }

  return {
    bikeId: me.id,
    category: query.category,
    level,
    criteria: criteria || 'none (no engine family or displacement on record)',
    count,
    peakPowerGainHp: peak,
    averagePowerGainHp: avg,
    costCents: costs.length ? { min: costs[0], median: quantileR7(costs, 0.5), max: costs[costs.length - 1] } : null,
    lowConfidence,
    message,
    disclaimer: TYPICAL_DISCLAIMER,
    quantileMethod: QUANTILE_METHOD,
    builds,
  };
}
