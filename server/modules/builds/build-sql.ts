import type { EntityManager } from '@mikro-orm/postgresql';
import type { HeadWorkLevel, PartCategory } from '@shared/parts';
import type { BuildItemDto, BuildPartDto } from '@shared/schemas/builds';

/** Collects bound values; `p(v)` returns the placeholder. Every user value goes through it. */
export class Sql {
  readonly params: unknown[] = [];
  p(v: unknown): string {
    this.params.push(v);
    return '?';
  }
  /** Text written with another Sql's placeholders, spliced in here (its values join ours in place). */
  embed(other: Sql, text: string): string {
    this.params.push(...other.params);
    return text;
  }
  list(values: readonly unknown[]): string {
    return values.map((v) => this.p(v)).join(', ');
  }
}

export const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/**
 * The full-text expressions, exactly as the expression indexes of Migration20261201235000 spell
 * them (an expression index is only used when the query repeats its expression).
 */
export const FTS = {
  part: (alias: string) => `to_tsvector('english', ${alias}.description)`,
  stage: (alias: string) => `to_tsvector('english', ${alias}.name || ' ' || coalesce(${alias}.description, ''))`,
  run: (alias: string) => `to_tsvector('english', coalesce(${alias}.note, ''))`,
};

/** Columns every build row selects (stage `s`, bike `b`, customer `c`). */
export const BUILD_COLUMNS = `
  s.id as stage_id, s.bike_id, s.name as stage_name, s.position as stage_position,
  to_char(coalesce(s.date, s.created_at::date), 'YYYY-MM-DD') as stage_date,
  s.gain_peak_power_hp, s.gain_peak_torque_lbft, s.gain_area_pct, s.gain_average_power_hp,
  s.total_cost_cents, b.make, b.model, b.year, b.engine_family, b.displacement_cc, b.cylinders,
  b.customer_id, c.name as customer_name`;

export interface BuildRow {
  stage_id: string;
  bike_id: string;
  stage_name: string;
  stage_position: number;
  stage_date: string;
  gain_peak_power_hp: number | null;
  gain_peak_torque_lbft: number | null;
  gain_area_pct: number | null;
  gain_average_power_hp: number | null;
  total_cost_cents: number;
  make: string;
  model: string;
  year: number | null;
  engine_family: string | null;
  displacement_cc: number | null;
  cylinders: number | null;
  customer_id: string;
  customer_name: string;
  score?: number;
}

interface PartRow {
  build_stage_id: string;
  category: PartCategory;
  description: string;
  head_work_level: HeadWorkLevel | null;
  added_here: boolean;
  cost_cents: number;
}

/** Cumulative parts (this stage and every earlier stage of the same bike) of each given stage. */
export async function cumulativeParts(em: EntityManager, shopId: string, stageIds: string[]): Promise<Map<string, BuildPartDto[]>> {
  const out = new Map<string, BuildPartDto[]>(stageIds.map((id) => [id, []]));
  if (!stageIds.length) return out;
  const q = new Sql();
  const rows = (await em.getConnection().execute(
    `select s.id as build_stage_id, p.category, p.description, p.head_work_level, (ps.id = s.id) as added_here,
            (p.part_cost_cents + p.labour_cost_cents)::int as cost_cents
       from stage s
       join stage ps on ps.bike_id = s.bike_id and ps.position <= s.position
       join part p on p.stage_id = ps.id
      where s.shop_id = ${q.p(shopId)} and s.id in (${q.list(stageIds)})
      order by ps.position, p.created_at, p.id`,
    q.params,
  )) as PartRow[];
  for (const r of rows) {
    out.get(r.build_stage_id)?.push({
      category: r.category,
      description: r.description,
      headWorkLevel: r.head_work_level,
      addedInThisStage: r.added_here,
      costCents: r.cost_cents,
    });
  }
  return out;
}

export function toBuildItem(r: BuildRow, parts: BuildPartDto[]): BuildItemDto {
  return {
    bikeId: r.bike_id,
    stageId: r.stage_id,
    stageName: r.stage_name,
    stagePosition: r.stage_position,
    date: r.stage_date,
    make: r.make,
    model: r.model,
    year: r.year,
    engineFamily: r.engine_family,
    displacementCc: r.displacement_cc,
    cylinders: r.cylinders,
    customerId: r.customer_id,
    customerName: r.customer_name,
    peakPowerGainHp: r.gain_peak_power_hp,
    peakTorqueGainLbft: r.gain_peak_torque_lbft,
    areaGainPct: r.gain_area_pct,
    averagePowerGainHp: r.gain_average_power_hp,
    costCents: r.total_cost_cents,
    cumulativeCostCents: parts.reduce((sum, p) => sum + p.costCents, 0),
    parts,
    score: r.score ?? 0,
  };
}
