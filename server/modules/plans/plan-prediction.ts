/**
 * Use case: what the archive says a plan's work added on similar builds. One category is the
 * build finder's typical outcome, computed by the same functions (buildsThatAdded +
 * summarizeOutcome); several categories use builds whose stage added the whole combination, and
 * fall back to the sum of single-category medians, labelled as an estimate, when those are few.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { gridPoints, interpolateSorted } from '@shared/analysis/resample';
import type { PlanItemDto, PlanPredictionDto, PredictionBandDto } from '@shared/schemas/plans';
import type { TypicalBuildDto } from '@shared/schemas/builds';
import { Stage } from '../stages/stage.entity';
import { correctedCurve } from '../builds/build-outcome.service';
import { QUANTILE_METHOD } from '../builds/stats';
import { buildsThatAdded, partKey, partKeyLabel, plannedBike, similarityCriteria, type PlannedBike } from '../builds/build-typical.service';
import {
  MIN_CONFIDENT_BUILDS,
  TYPICAL_DISCLAIMER,
  costPerHpCents,
  fmtHpChange,
  gainBand,
  gainCurve,
  outcomeMessage,
  summarizeOutcome,
  sumOfMedians,
  type GainCurve,
} from '../builds/outcome-engine';

/** Distinct part keys of a plan's items, in a stable order. */
export function planKeys(items: readonly Pick<PlanItemDto, 'category' | 'headWork'>[]): string[] {
  return [...new Set(items.map((i) => partKey(i.category, i.headWork)))].sort();
}

const BAND_STEP_RPM = 100;

/** Each build's gain curve: its stage's reference run minus the nearest earlier measured stage's. */
async function gainCurves(em: EntityManager, shopId: string, builds: readonly TypicalBuildDto[]): Promise<GainCurve[]> {
  if (!builds.length) return [];
  const stages = await em.find(
    Stage,
    { shop: shopId, bike: { $in: [...new Set(builds.map((b) => b.bikeId))] }, referenceRun: { $ne: null } },
    { orderBy: { position: 'asc', createdAt: 'asc' }, populate: ['referenceRun', 'referenceRun.curve'] as never[] },
  );
  const out: GainCurve[] = [];
  for (const b of builds) {
    const mine = stages.filter((s) => s.bike.id === b.bikeId);
    const at = mine.findIndex((s) => s.id === b.stageId);
    if (at < 1) continue;
    const after = correctedCurve(mine[at].referenceRun!);
    const before = mine.slice(0, at).reverse().map((s) => correctedCurve(s.referenceRun!)).find(Boolean);
    if (after && before && after.rpm.length > 1 && before.rpm.length > 1) out.push(gainCurve(before, after));
  }
  return out;
}

/** The band over this bike's latest reference run (highest-positioned stage that has one). */
async function predictionBand(em: EntityManager, me: PlannedBike, builds: readonly TypicalBuildDto[]): Promise<PredictionBandDto | null> {
  const latest = await em.findOne(
    Stage,
    { shop: me.shopId, bike: me.id, referenceRun: { $ne: null } },
    { orderBy: { position: 'desc', createdAt: 'desc' }, populate: ['referenceRun', 'referenceRun.curve'] as never[] },
  );
  const base = latest?.referenceRun ? correctedCurve(latest.referenceRun) : null;
  if (!latest || !base || base.rpm.length < 2) return null;
  const curves = await gainCurves(em, me.shopId, builds);
  if (!curves.length) return null;
  const band = gainBand(curves, gridPoints(base.rpm[0], base.rpm[base.rpm.length - 1], BAND_STEP_RPM));
  if (!band.rpm.length) return null;
  return {
    baseRunId: latest.referenceRun!.id,
    baseLabel: `${latest.name} reference run`,
    rpm: band.rpm,
    basePowerHp: interpolateSorted(base.rpm, base.powerHp, band.rpm),
    gainMedianHp: band.median,
    gainQ1Hp: band.q1,
    gainQ3Hp: band.q3,
    builds: band.builds,
  };
}

/** The prediction stored on a plan (recomputed on every edit and at each send). */
export async function predictPlan(em: EntityManager, shopId: string, bikeId: string, items: readonly PlanItemDto[], totalCostCents: number): Promise<PlanPredictionDto> {
  const me = await plannedBike(em, shopId, bikeId);
  const keys = planKeys(items);
  const what = keys.map(partKeyLabel).join(' + ');
  const { comparable, builds } = await buildsThatAdded(em, me, keys);
  const summary = summarizeOutcome(builds);
  const base = { keys, criteria: similarityCriteria(me), disclaimer: TYPICAL_DISCLAIMER, quantileMethod: QUANTILE_METHOD, estimate: null };

  if (keys.length > 1 && summary.count < MIN_CONFIDENT_BUILDS && comparable) {
    const parts = await Promise.all(keys.map(async (key) => ({ key, summary: summarizeOutcome((await buildsThatAdded(em, me, [key])).builds) })));
    const sum = sumOfMedians(parts);
    if (sum) {
      return {
        ...base,
        kind: 'estimate',
        count: summary.count,
        peakPowerGainHp: null,
        averagePowerGainHp: null,
        estimate: { ...sum, parts: parts.map((p) => ({ key: p.key, count: p.summary.count, medianPeakHp: p.summary.peakPowerGainHp?.median ?? null })) },
        costPerHpCents: costPerHpCents(totalCostCents, sum.peakPowerGainHp),
        lowConfidence: true,
        message:
          (summary.count
            ? `Only ${summary.count} similar build${summary.count === 1 ? '' : 's'} added ${what.toLowerCase()} together — too few to call typical. `
            : `No similar build added ${what.toLowerCase()} together. `) +
          `Estimate: adding the median step of each part measured separately gives ${fmtHpChange(sum.peakPowerGainHp)} at peak (` +
          parts.map((p) => `${partKeyLabel(p.key)} ${fmtHpChange(p.summary.peakPowerGainHp!.median)}, ${p.summary.count} build${p.summary.count === 1 ? '' : 's'}`).join('; ') +
          '). Parts that work together rarely add up exactly, so treat this as a rough guide.',
        builds,
        band: await predictionBand(em, me, builds),
      };
    }
  }
  const median = summary.peakPowerGainHp?.median;
  return {
    ...base,
    kind: summary.count === 0 ? 'none' : keys.length === 1 ? 'single' : 'combination',
    count: summary.count,
    peakPowerGainHp: summary.peakPowerGainHp,
    averagePowerGainHp: summary.averagePowerGainHp,
    costPerHpCents: costPerHpCents(totalCostCents, median),
    lowConfidence: summary.lowConfidence,
    message: outcomeMessage(summary, what, comparable),
    builds,
    band: await predictionBand(em, me, builds),
  };
}
