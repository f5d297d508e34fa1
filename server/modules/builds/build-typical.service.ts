import type { EntityManager } from '@mikro-orm/postgresql';
import { HEAD_WORK_LABELS, PART_CATEGORY_LABELS } from '@shared/parts';
import type { Actor } from '../../http/actor';
import { notFound } from '../../lib/errors';
import type { TypicalQuery } from './build.schemas';
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
  if (me.engine_family) conditions.push(`similarity(b.engine_family, ${cond.p(me.engine_family)}) >= ${TYPICAL_FAMILY_SIMILARITY}`);
  if (me.displacement_cc) {
    conditions.push(`b.displacement_cc between ${cond.p(me.displacement_cc * (1 - TYPICAL_DISPLACEMENT_TOLERANCE))} and ${cond.p(me.displacement_cc * (1 + TYPICAL_DISPLACEMENT_TOLERANCE))}`);
  }
  const what = `${PART_CATEGORY_LABELS[query.category]}${level ? `: ${HEAD_WORK_LABELS[level]}` : ''}`;
  const criteria = [
    me.engine_family ? `engine family like “${me.engine_family}”` : null,
    me.displacement_cc ? `displacement within ±${TYPICAL_DISPLACEMENT_TOLERANCE * 100} % of ${Math.round(me.displacement_cc)} cm³` : null,
  ].filter(Boolean).join(' and ');

  let builds: TypicalBuildDto[] = [];
  if (conditions.length) {
    const sql = `
      with sim as (
        select b.id, b.make, b.model, b.engine_family, b.displacement_cc from bike b
         where b.shop_id = ${q.p(shop)} and b.id <> ${q.p(me.id)} and ${q.embed(cond, conditions.join(' and '))}),
      added as (
        select distinct on (s.bike_id) s.id, s.bike_id, s.position, s.name,
               to_char(coalesce(s.date, s.created_at::date), 'YYYY-MM-DD') as stage_date,
               s.gain_peak_power_hp, s.gain_average_power_hp, s.total_cost_cents
          from stage s join sim on sim.id = s.bike_id
         where s.shop_id = ${q.p(shop)}
           and exists (select 1 from part p where p.stage_id = s.id and p.category = ${q.p(query.category)}${level ? ` and p.head_work_level = ${q.p(level)}` : ''})
         order by s.bike_id, s.position)
      select a.id as stage_id, a.bike_id, a.name as stage_name, a.stage_date, a.total_cost_cents,
             sim.make, sim.model, sim.engine_family, sim.displacement_cc,
             (a.gain_peak_power_hp - coalesce(prev.gain_peak_power_hp, 0))::float8 as peak_inc,
             (a.gain_average_power_hp - coalesce(prev.gain_average_power_hp, 0))::float8 as avg_inc
        from added a join sim on sim.id = a.bike_id
        left join lateral (
          select ps.gain_peak_power_hp, ps.gain_average_power_hp from stage ps
           where ps.bike_id = a.bike_id and ps.position < a.position and ps.gain_peak_power_hp is not null
           order by ps.position desc limit 1) prev on true
       where a.gain_peak_power_hp is not null
       order by peak_inc desc, a.id`;
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
