/**
 * The figures of a bike's "Gains by stage", one number each, for the chart and the table under it
 * (pure: no React, no fetching). What each figure divides is said once in the card's description,
 * not repeated as a formula in every cell.
 */
import type { TimelineStage } from '@shared/schemas/comparison';

/** One bar of the gains chart: a measured stage's gain over the previous measured stage, or the whole build. */
export interface GainBar {
  /** Stage id, or "total" for the whole build since the baseline. */
  key: string;
  label: string;
  /** Peak power gain in hp (negative for a loss). */
  gainHp: number;
  /** Cents per hp of that gain; null when there is no positive gain to divide by. */
  costPerHpCents: number | null;
  /** The stage's gain is within its run-to-run spread. */
  withinSpread: boolean;
  isTotal: boolean;
}

/** One row of the table: every cell one figure (null = nothing to show). */
export interface GainRow {
  stageId: string;
  name: string;
  date: string | null;
  /** This stage's own parts and labour. */
  costCents: number;
  peakPowerHp: number | null;
  peakPowerRpm: number | null;
  peakTorqueLbft: number | null;
  /** Over the previous measured stage. */
  gainHp: number | null;
  /** What the work since the previous measured stage cost (stages without a reference run count here). */
  gainCostCents: number | null;
  costPerHpCents: number | null;
  /** Since the baseline (the first measured stage). */
  totalGainHp: number | null;
  totalCostCents: number | null;
  totalCostPerHpCents: number | null;
  /** ± hp of the stage's runs; null with one run. */
  spreadHp: number | null;
  spreadRuns: number | null;
  measured: boolean;
}

/** Each stage as table figures; cost spans follow the server's rule (every stage after the earlier measured stage up to this one). */
export function stageGainRows(stages: readonly TimelineStage[]): GainRow[] {
  const measured = stages.map((s, i) => (s.reference ? i : -1)).filter((i) => i >= 0);
  const base = measured[0];
  return stages.map((s, i) => {
    const prev = [...measured].reverse().find((m) => m < i);
    const spanCost = (from: number | undefined) => (from === undefined ? null : s.cumulativeCostCents - stages[from].cumulativeCostCents);
    return {
      stageId: s.stageId,
      name: s.name,
      date: s.date,
      costCents: s.costCents,
      peakPowerHp: s.reference?.peakPowerHp ?? null,
      peakPowerRpm: s.reference?.peakPowerRpm ?? null,
      peakTorqueLbft: s.reference?.peakTorqueLbft ?? null,
      gainHp: s.vsPrevious?.peakPowerHp ?? null,
      gainCostCents: s.vsPrevious ? spanCost(prev) : null,
      costPerHpCents: s.vsPrevious ? (s.costPerHp?.peakCents ?? null) : null,
      totalGainHp: s.vsBaseline?.peakPowerHp ?? null,
      totalCostCents: s.vsBaseline && base !== undefined && base < i ? spanCost(base) : null,
      totalCostPerHpCents: s.vsBaseline ? (s.cumulativeCostPerHp?.peakCents ?? null) : null,
      spreadHp: s.repeatability && s.repeatability.runs > 1 ? s.repeatability.peakPowerSpreadHp : null,
      spreadRuns: s.repeatability?.runs ?? null,
      measured: s.reference !== null,
    };
  });
}

/**
 * The chart's bars: each measured stage after the baseline with its gain over the previous measured
 * stage and that work's cost per hp, then the whole build since the baseline (when there are at
 * least two steps, otherwise the one step already is the whole build).
 */
export function stageGainBars(stages: readonly TimelineStage[]): GainBar[] {
  const steps: GainBar[] = stages
    .filter((s) => s.reference && s.vsPrevious)
    .map((s) => ({
      key: s.stageId,
      label: s.name,
      gainHp: s.vsPrevious!.peakPowerHp,
      costPerHpCents: s.costPerHp?.peakCents ?? null,
      withinSpread: s.vsPrevious!.withinRepeatability.peakPower === true,
      isTotal: false,
    }));
  if (steps.length < 2) return steps;
  const last = [...stages].reverse().find((s) => s.reference && s.vsBaseline);
  if (!last?.vsBaseline) return steps;
  const baseline = stages.find((s) => s.reference);
  return [
    ...steps,
    {
      key: 'total',
      label: `Whole build since ${baseline?.name ?? 'the baseline'}`,
      gainHp: last.vsBaseline.peakPowerHp,
      costPerHpCents: last.cumulativeCostPerHp?.peakCents ?? null,
      withinSpread: last.vsBaseline.withinRepeatability.peakPower === true,
      isTotal: true,
    },
  ];
}
