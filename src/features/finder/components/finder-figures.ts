/**
 * What the finder's charts draw, from the builds on screen (pure: no React, no fetching): each
 * build's peak gain against its cost, and the spread of gains per part category.
 */
import { PART_CATEGORIES, PART_CATEGORY_LABELS, type PartCategory } from '@shared/parts';
import type { BuildItemDto } from '@shared/schemas/builds';

export interface CostGainPoint {
  stageId: string;
  /** Whole currency units (cumulative build cost). */
  cost: number;
  gainHp: number;
  label: string;
}

/** Builds with a measured gain, as (build cost in whole units, peak gain in hp). */
export function costGainPoints(items: readonly BuildItemDto[]): CostGainPoint[] {
  return items
    .filter((b) => b.peakPowerGainHp !== null)
    .map((b) => ({
      stageId: b.stageId,
      cost: b.cumulativeCostCents / 100,
      gainHp: b.peakPowerGainHp!,
      label: `${b.year ? `${b.year} ` : ''}${b.make} ${b.model}, ${b.stageName}`,
    }));
}

/**
 * The p-quantile of ascending values by linear interpolation between closest ranks (Hyndman and
 * Fan's type 7, the default of R, NumPy and spreadsheet QUARTILE.INC).
 */
export function quantileSorted(sorted: readonly number[], p: number): number {
  if (sorted.length === 0) return Number.NaN;
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.ceil(h);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

export interface CategorySpread {
  category: PartCategory;
  label: string;
  /** Builds that include the category. */
  count: number;
  min: number;
  q1: number;
  median: number;
  q3: number;
  max: number;
}

/**
 * Peak gains of the builds that include each part category (a build counts for every category it
 * has), as five figures: lowest, lower quartile, median, upper quartile, highest. Categories in
 * the parts list's order; categories no build has are left out.
 */
export function gainsByCategory(items: readonly BuildItemDto[]): CategorySpread[] {
  const byCategory = new Map<PartCategory, number[]>();
  for (const b of items) {
    if (b.peakPowerGainHp === null) continue;
    for (const c of new Set(b.parts.map((p) => p.category))) byCategory.set(c, [...(byCategory.get(c) ?? []), b.peakPowerGainHp]);
  }
  return PART_CATEGORIES.filter((c) => byCategory.has(c)).map((c) => {
    const v = [...byCategory.get(c)!].sort((a, b) => a - b);
    return { category: c, label: PART_CATEGORY_LABELS[c], count: v.length, min: v[0], q1: quantileSorted(v, 0.25), median: quantileSorted(v, 0.5), q3: quantileSorted(v, 0.75), max: v[v.length - 1] };
  });
}
