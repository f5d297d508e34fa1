/**
 * The pure half of "what did this work add on similar builds": the one summary both the build
 * finder's typical outcome and a build plan's prediction use, the multi-category estimate, the
 * cost per hp, and the per-rpm gain band. No I/O; unit-tested in tests/unit/builds.
 */
import { interpolateSorted } from '@shared/analysis/resample';
import type { Spread, TypicalBuildDto } from '@shared/schemas/builds';
import { fiveNumbers, quantileR7 } from './stats';

/** Fewer builds than this and the figure is flagged as weak. */
export const MIN_CONFIDENT_BUILDS = 5;

export const TYPICAL_DISCLAIMER = 'Past results measured on similar builds in this shop — not a promise of what this bike will make.';

export interface OutcomeSummary {
  count: number;
  peakPowerGainHp: Spread | null;
  averagePowerGainHp: Spread | null;
  costCents: { min: number; median: number; max: number } | null;
  lowConfidence: boolean;
}

/** Count, R-7 five-number summaries of the per-stage increments, and the stage costs. */
export function summarizeOutcome(builds: readonly Pick<TypicalBuildDto, 'peakPowerGainHp' | 'averagePowerGainHp' | 'costCents'>[]): OutcomeSummary {
  const costs = builds.map((b) => b.costCents).sort((a, b) => a - b);
  return {
    count: builds.length,
    peakPowerGainHp: fiveNumbers(builds.map((b) => b.peakPowerGainHp)),
    averagePowerGainHp: fiveNumbers(builds.map((b) => b.averagePowerGainHp).filter((v): v is number => v !== null)),
    costCents: costs.length ? { min: costs[0], median: quantileR7(costs, 0.5), max: costs[costs.length - 1] } : null,
    lowConfidence: builds.length < MIN_CONFIDENT_BUILDS,
  };
}

export const fmtHpChange = (n: number) => `${n >= 0 ? '+' : '−'}${Math.abs(n).toFixed(1)} hp`;

/** The finder's sentence for a summary, worded as past results. */
export function outcomeMessage(s: OutcomeSummary, what: string, comparable: boolean): string {
  if (!comparable) return 'This bike has no engine family or displacement on record, so there is nothing to compare it with.';
  if (s.count === 0) return `No similar build in this shop has had ${what.toLowerCase()} measured yet.`;
  const range = s.peakPowerGainHp ? `${fmtHpChange(s.peakPowerGainHp.q1)} to ${fmtHpChange(s.peakPowerGainHp.q3)} at peak (middle half), median ${fmtHpChange(s.peakPowerGainHp.median)}` : '';
  return s.lowConfidence
    ? `Only ${s.count} similar build${s.count === 1 ? '' : 's'} had ${what.toLowerCase()} measured — too few to call typical; treat ${range} as a rough guide.`
    : `${s.count} similar builds had ${what.toLowerCase()} measured: ${range}.`;
}

/**
 * Sum of single-category medians: the fallback when too few builds added the whole combination.
 * Adding medians assumes the gains add up, which parts that work together (cam and heads, a tune
 * after an exhaust) often do not — hence always labelled an estimate. Null when any part has no median.
 */
export function sumOfMedians(parts: readonly { key: string; summary: OutcomeSummary }[]): { peakPowerGainHp: number; averagePowerGainHp: number | null } | null {
  if (!parts.length || parts.some((p) => !p.summary.peakPowerGainHp)) return null;
  const peak = parts.reduce((sum, p) => sum + p.summary.peakPowerGainHp!.median, 0);
  const avgs = parts.map((p) => p.summary.averagePowerGainHp?.median);
  return { peakPowerGainHp: peak, averagePowerGainHp: avgs.every((v): v is number => v !== undefined) ? avgs.reduce((a, b) => a + b, 0) : null };
}

/** Whole cents per hp of expected peak gain; null unless the gain is positive. */
export function costPerHpCents(totalCostCents: number, gainHp: number | null | undefined): number | null {
  if (gainHp == null || !(gainHp > 0)) return null;
  return Math.round(totalCostCents / gainHp);
}

/** Deposit asked for a plan, in whole cents: a percentage (rounded half up) or a fixed sum, never above the plan. */
export function depositFor(rule: { mode: 'off' | 'percent' | 'fixed'; percent: number; fixedCents: number }, totalCostCents: number): number {
  if (rule.mode === 'percent') return Math.min(totalCostCents, Math.round((totalCostCents * rule.percent) / 100));
  if (rule.mode === 'fixed') return Math.min(totalCostCents, rule.fixedCents);
  return 0;
}

/** One build's gain at each rpm: the stage's reference curve minus the earlier measured stage's, on their shared range. */
export interface GainCurve {
  rpm: readonly number[];
  gainHp: readonly number[];
}

export interface GainBand {
  rpm: number[];
  median: number[];
  q1: number[];
  q3: number[];
  builds: number[];
}

/**
 * Median and interquartile range of the gain at each rpm of `grid`, over the builds whose
 * gain curve covers that rpm (linear interpolation between samples; no extrapolation). Points
 * covered by fewer than `minBuilds` builds are left out.
 */
export function gainBand(curves: readonly GainCurve[], grid: readonly number[], minBuilds = 2): GainBand {
  const out: GainBand = { rpm: [], median: [], q1: [], q3: [], builds: [] };
  const sampled = curves
    .filter((c) => c.rpm.length > 1)
    .map((c) => ({ lo: c.rpm[0], hi: c.rpm[c.rpm.length - 1], at: interpolateSorted(c.rpm, c.gainHp, [...grid]) }));
  grid.forEach((rpm, i) => {
    const xs = sampled.filter((c) => rpm >= c.lo && rpm <= c.hi).map((c) => c.at[i]).filter(Number.isFinite).sort((a, b) => a - b);
    if (xs.length < minBuilds) return;
    out.rpm.push(rpm);
    out.median.push(quantileR7(xs, 0.5));
    out.q1.push(quantileR7(xs, 0.25));
    out.q3.push(quantileR7(xs, 0.75));
    out.builds.push(xs.length);
  });
  return out;
}

/** The gain of `after` over `before` at every rpm both cover, on `after`'s own samples. */
export function gainCurve(before: { rpm: readonly number[]; powerHp: readonly number[] }, after: { rpm: readonly number[]; powerHp: readonly number[] }): GainCurve {
  const lo = Math.max(before.rpm[0], after.rpm[0]);
  const hi = Math.min(before.rpm[before.rpm.length - 1], after.rpm[after.rpm.length - 1]);
  const idx = after.rpm.map((r, i) => [r, i] as const).filter(([r]) => r >= lo && r <= hi);
  const at = interpolateSorted(before.rpm, before.powerHp, idx.map(([r]) => r));
  return { rpm: idx.map(([r]) => r), gainHp: idx.map(([, i], k) => after.powerHp[i] - at[k]) };
}
