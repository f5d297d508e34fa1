import type { EntityManager } from '@mikro-orm/postgresql';
import { applyCorrection, compareCurves, type NormalizedCurve } from '@shared/analysis/index';
import { Stage, Part } from '../stages/stage.entity';
import { Run } from '../runs/run.entity';

/** A run's stored (uncorrected) curve with the run's own correction applied, as its figures were reported. */
export function correctedCurve(run: Run): NormalizedCurve | null {
  if (!run.curve || run.status !== 'ready') return null;
  return applyCorrection(run.curve, run.correctionFactor ?? 1);
}

/**
 * Recompute the derived columns of every stage of a bike: total cost, and the gains of its
 * reference run against the baseline (the lowest-positioned stage that has a reference run).
 * Called whenever a reference run, a stage's order or its parts change, so the build finder
 * can search outcomes without recomputing curves.
 */
export async function refreshBikeOutcomes(em: EntityManager, bikeId: string): Promise<void> {
  const stages = await em.find(Stage, { bike: bikeId }, { orderBy: { position: 'asc' }, populate: ['referenceRun', 'referenceRun.curve'] as never[] });
  if (!stages.length) return;
  const parts = await em.find(Part, { stage: { $in: stages.map((s) => s.id) } });
  const baseline = stages.find((s) => s.referenceRun && correctedCurve(s.referenceRun));
  const baseCurve = baseline?.referenceRun ? correctedCurve(baseline.referenceRun) : null;
  for (const stage of stages) {
    stage.totalCostCents = parts.filter((p) => p.stage.id === stage.id).reduce((sum, p) => sum + p.partCostCents + p.labourCostCents, 0);
    const curve = stage.referenceRun ? correctedCurve(stage.referenceRun) : null;
    let figures: ReturnType<typeof compareCurves> | null = null;
    if (baseCurve && curve && stage !== baseline) {
      try {
        figures = compareCurves(baseCurve, curve);
      } catch {
        figures = null; // no common rpm range: nothing honest to store
      }
    }
    stage.gainPeakPowerHp = figures?.peakPowerGain.hp ?? null;
    stage.gainPeakTorqueLbft = figures?.peakTorqueGain.lbft ?? null;
    stage.gainAreaPct = figures?.areaGainPct ?? null;
    stage.gainAveragePowerHp = figures?.averagePowerGainHp ?? null;
  }
  await em.flush();
}
