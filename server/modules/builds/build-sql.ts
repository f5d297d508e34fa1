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

/**
 * Columns every build row selects from build_index `bi` (Migration20261202001000): one row per
 * stage with the bike's fields and the cumulative build, kept current by triggers.
 */
export const BUILD_INDEX_COLUMNS = `
  bi.stage_id, bi.bike_id, bi.stage_name, bi.stage_position, to_char(bi.stage_date, 'YYYY-MM-DD') as stage_date,
  bi.gain_peak_power_hp, bi.gain_peak_torque_lbft, bi.gain_area_pct, bi.gain_average_power_hp,
  bi.total_cost_cents, bi.make, bi.model, bi.year, bi.engine_family, bi.displacement_cc, bi.cylinders,
  bi.customer_id, bi.parts`;

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

/** A row of BUILD_INDEX_COLUMNS (plus the customer's name): the build with its cumulative parts. */
export interface BuildIndexRow extends BuildRow {
  parts: BuildPartDto[];
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
