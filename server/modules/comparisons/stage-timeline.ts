/**
 * Use case: a bike's build history — every stage in order with its reference figures, the gain
 * against the previous stage and against the first (baseline) stage, parts and costs, cost per
 * horsepower, and the stage's run-to-run spread.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { tenantScope } from '../../http/tenant-scope';
import { notFound } from '../../lib/errors';
import type { ComparisonOptions, ComparisonWarning, StageTimelineDto, TimelineGain, TimelineStage } from '@shared/schemas/comparison';
import type { CorrectionId } from '@shared/schemas/run';
import { type ComparisonFigures, compareCurves } from '@shared/analysis/compare';
import { isAnalysisError } from '@shared/analysis/errors';
import { Stage, Part } from '../stages/stage.entity';
import { Bike } from '../bikes/bike.entity';
import { costBetweenStages, stageCostCents, type CostedStage } from './stage-cost';
import { loadRunRows, type RunRow } from './comparison-runs';
import { DEFAULT_BAND_WIDTH, type Prepared, bikeLabel, fairnessWarnings, isComparisonEngineError, maxKnown, prepare, r4, stageSpreads, within } from './engine';
import { engineErrorToAppError } from './evaluate-comparison';

function gainOf(f: ComparisonFigures, spread: { peak: number | null; avg: number | null }): TimelineGain {
  return {
    peakPowerHp: r4(f.peakPowerGain.hp),
    peakPowerPct: r4(f.peakPowerGain.pct),
    peakTorqueLbft: r4(f.peakTorqueGain.lbft),
    averagePowerHp: r4(f.averagePowerGainHp),
    areaPct: r4(f.areaGainPct),
    withinRepeatability: { peakPower: within(f.peakPowerGain.hp, spread.peak), averagePower: within(f.averagePowerGainHp, spread.avg) },
  };
}
const perHp = (cents: number, gain: number) => (gain > 0 ? Math.round(cents / gain) : null);

/** Two reference runs compared, or null when they share no range. */
function safeCompare(a: Prepared, b: Prepared): ComparisonFigures | null {
  try {
    return compareCurves(a.curve, b.curve, { bandWidthRpm: DEFAULT_BAND_WIDTH });
  } catch (e) {
    if (isAnalysisError(e)) return null;
    throw e;
  }
}

export async function stageTimeline(em: EntityManager, actor: Actor, query: { bikeId: string; correction?: CorrectionId }): Promise<StageTimelineDto> {
  const bike = await em.findOne(Bike, tenantScope<Bike>(actor, 'customer', { id: query.bikeId }));
  if (!bike) throw notFound('Bike');
  const stages = await em.find(Stage, { bike, shop: actor.shopId }, { orderBy: { position: 'asc', createdAt: 'asc' } });
  const parts = stages.length ? await em.find(Part, { stage: { $in: stages.map((s) => s.id) } }, { orderBy: { createdAt: 'asc' } }) : [];
  const options: ComparisonOptions = { correction: query.correction };
  const refIds = stages.map((s) => s.referenceRun?.id).filter((v): v is string => !!v);
  const stageIds = stages.map((s) => s.id);
  const rows = await loadRunRows(em, actor, refIds, stageIds);
  const rowById = new Map(rows.map((r) => [r.id, r]));
  const refs = [...new Set(refIds)].map((id) => rowById.get(id)).filter((r): r is RunRow => !!r);
  const prepared = new Map<string, Prepared>();
  const warnings: ComparisonWarning[] = [];
  for (const r of refs) {
    try {
      prepared.set(r.id, prepare(r, options));
    } catch (e) {
      if (!isComparisonEngineError(e)) throw e;
    }
  }
  let spreads: ReturnType<typeof stageSpreads>;
  try {
    spreads = stageSpreads(rows, stageIds, options, prepared);
  } catch (e) {
    throw engineErrorToAppError(e);
  }
  const used = [...prepared.values()];
  if (used.length >= 2) warnings.push(...fairnessWarnings(used, used[0]).filter((w) => w.code !== 'LITTLE_OVERLAP'));

  let baseline: { stage: Stage; p: Prepared } | null = null;
  let previous: { stage: Stage; p: Prepared } | null = null;
  let cumulative = 0;
  const out: TimelineStage[] = [];
  // The same cost rule as the gain report (stage-cost.ts): a gain from stage A to stage B is paid
  // for by every stage after A up to B, including stages in between without a reference run.
  const costed: CostedStage[] = stages.map((st) => ({ id: st.id, name: st.name, costCents: stageCostCents(st, parts.filter((x) => x.stage.id === st.id)) }));
  for (const [index, stage] of stages.entries()) {
    const stageParts = parts.filter((x) => x.stage.id === stage.id);
    const cost = costed[index].costCents;
    cumulative += cost;
    const p = stage.referenceRun ? prepared.get(stage.referenceRun.id) : undefined;
    const own = spreads.get(stage.id);
    const row: TimelineStage = {
      stageId: stage.id,
      name: stage.name,
      position: stage.position,
      date: stage.date,
      referenceRunId: stage.referenceRun?.id ?? null,
      reference: p
        ? { peakPowerHp: p.summary.peakPower.hp, peakPowerRpm: p.summary.peakPower.rpm, peakTorqueLbft: p.summary.peakTorque.lbft, peakTorqueRpm: p.summary.peakTorque.rpm, correction: p.summary.correction.standard }
        : null,
      parts: stageParts.map((x) => ({ id: x.id, category: x.category, description: x.description, partCostCents: x.partCostCents, labourCostCents: x.labourCostCents })),
      costCents: cost,
      cumulativeCostCents: cumulative,
      vsPrevious: null,
      vsBaseline: null,
      costPerHp: null,
      cumulativeCostPerHp: null,
      repeatability: own?.info ?? null,
    };
    if (p) {
      const spreadVs = (other: Stage) => {
        const o = spreads.get(other.id);
        return { peak: maxKnown(o?.info.peakPowerSpreadHp, own?.info.peakPowerSpreadHp), avg: maxKnown(o?.info.averagePowerSpreadHp, own?.info.averagePowerSpreadHp) };
      };
      if (previous) {
        const f = safeCompare(previous.p, p);
        if (f) {
          row.vsPrevious = gainOf(f, spreadVs(previous.stage));
          const spent = costBetweenStages(costed, previous.stage.id, stage.id)?.totalCents ?? cost;
          row.costPerHp = { peakCents: perHp(spent, f.peakPowerGain.hp), averageCents: perHp(spent, f.averagePowerGainHp) };
        }
      }
      if (baseline) {
        const f = safeCompare(baseline.p, p);
        if (f) {
          row.vsBaseline = gainOf(f, spreadVs(baseline.stage));
          const spent = costBetweenStages(costed, baseline.stage.id, stage.id)?.totalCents ?? 0;
          row.cumulativeCostPerHp = { peakCents: perHp(spent, f.peakPowerGain.hp), averageCents: perHp(spent, f.averagePowerGainHp) };
        }
      }
      if (!baseline) baseline = { stage, p };
      previous = { stage, p };
    }
    out.push(row);
  }
  return { bikeId: bike.id, bikeLabel: bikeLabel(bike), correction: query.correction ?? null, stages: out, warnings };
}
