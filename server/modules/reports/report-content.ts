/**
 * What a gain report says: built once from the saved comparison, evaluated once (in the shop's units
 * for the sentences), and used for both the PDF and the version's stored summary.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { AppError } from '../../lib/errors';
import type { ComparisonOptions, ComparisonPreview } from '@shared/schemas/comparison';
import { standardLabel } from '../comparisons/engine';
import { type EvaluateComparison, evaluateComparison } from '../comparisons/evaluate-comparison';
import { findComparison, previewErrorOf, savedInput } from '../comparisons/saved-comparisons';
import { costBetweenStages, stageCostCents } from '../comparisons/stage-cost';
import { Bike } from '../bikes/bike.entity';
import { Shop } from '../shops/shop.entity';
import { Stage, Part } from '../stages/stage.entity';
import { Dyno } from '../dynos/dyno.entity';
import type { ReportData, ReportStage } from './report-data';
import { fmtPowerGain } from './figures';

function curvesOf(preview: ComparisonPreview): ReportData['curves'] {
  return preview.curves.runs.map((c) => {
    const rpm: number[] = [];
    const powerHp: number[] = [];
    const torqueLbft: number[] = [];
    preview.curves.rpm.forEach((r, i) => {
      const p = c.powerHp[i];
      const t = c.torqueLbft[i];
      if (p !== null && t !== null) {
        rpm.push(r);
        powerHp.push(p);
        torqueLbft.push(t);
      }
    });
    return { runId: c.runId, rpm, powerHp, torqueLbft };
  });
}

function repeatabilityText(preview: ComparisonPreview, units: Shop['units']): ReportData['repeatability'] {
  const rep = preview.repeatability;
  if (!rep.length) {
    return { text: 'Each stage here was measured with one run, so the run-to-run spread is not known; treat small differences with care.', runs: 0, peakPowerSpreadHp: null };
  }
  const parts = rep.map((r) => `${r.stageName}: ${r.runs} runs, peak power within ${fmtPowerGain(r.peakPowerSpreadHp, units).replace(/^\+/, '')} of each other`);
  const worst = Math.max(...rep.map((r) => r.peakPowerSpreadHp));
  return {
    text: `Repeatability: ${parts.join('; ')}. Differences smaller than the spread are within run-to-run variation.`,
    runs: rep.reduce((s, r) => s + r.runs, 0),
    peakPowerSpreadHp: worst,
  };
}

/**
 * The build stages the report lists — every stage of the bike from the earliest to the latest stage
 * in the comparison, in build order, so stages in between without a run still show — and the cost
 * behind the headline gain: every stage after the baseline's stage up to the compared run's stage
 * (the rule of the stage timeline, ../comparisons/stage-cost.ts).
 */
async function stagesOf(em: EntityManager, actor: Actor, preview: ComparisonPreview, comparedRunId: string | null): Promise<{ stages: ReportStage[]; cost: { totalCostCents: number; fromStageName: string; stageNames: string[] } | null }> {
  const ids = new Set(preview.runs.map((r) => r.stageId).filter((s): s is string => !!s));
  if (!ids.size) return { stages: [], cost: null };
  const bikeIds = [...new Set(preview.runs.map((r) => r.bikeId).filter((b): b is string => !!b))];
  const all = await em.find(Stage, { bike: { $in: bikeIds }, shop: actor.shopId }, { orderBy: { position: 'asc', createdAt: 'asc' } });
  const baseStageId = preview.baseline.stageId;
  const comparedStageId = comparedRunId ? preview.runs.find((r) => r.runId === comparedRunId)?.stageId ?? null : null;
  const bikeOfBaseline = all.find((st) => st.id === baseStageId)?.bike.id;
  // One bike's build: the baseline's (a comparison across bikes lists only the stages it used).
  const build = bikeOfBaseline ? all.filter((st) => st.bike.id === bikeOfBaseline) : [];
  const used = build.map((st, i) => (ids.has(st.id) ? i : -1)).filter((i) => i >= 0);
  const listed = used.length ? build.slice(Math.min(...used), Math.max(...used) + 1) : [];
  const others = all.filter((st) => ids.has(st.id) && !listed.includes(st));
  const shown = [...listed, ...others];
  const parts = shown.length ? await em.find(Part, { stage: { $in: [...new Set([...shown, ...build].map((s) => s.id))] }, shop: actor.shopId }, { orderBy: { createdAt: 'asc' } }) : [];
  const partsOf = (id: string) => parts.filter((p) => p.stage.id === id);
  const out = shown.map((st) => {
    const own = partsOf(st.id);
    return {
      name: st.name,
      date: st.date,
      isBaseline: st.id === baseStageId,
      parts: own.map((p) => ({ category: p.category, description: p.description, partCostCents: p.partCostCents, labourCostCents: p.labourCostCents })),
      totalCostCents: stageCostCents(st, own),
    };
  });
  const costed = build.map((st) => ({ id: st.id, name: st.name, costCents: stageCostCents(st, partsOf(st.id)) }));
  const between = costBetweenStages(costed, baseStageId, comparedStageId);
  const baseName = build.find((st) => st.id === baseStageId)?.name ?? 'the baseline';
  return {
    stages: out,
    cost: between && between.totalCents > 0 ? { totalCostCents: between.totalCents, fromStageName: baseName, stageNames: between.stages.map((x) => x.name) } : null,
  };
}

const KIND_LABEL: Record<string, string> = { inertia: 'inertia', 'eddy-current': 'eddy-current', other: 'other type' };

/**
 * Everything the PDF prints, from the saved comparison evaluated now — once: the figures are the
 * comparison's (its options, runs and kept colours), only the sentences follow the shop's units.
 * `evaluate` is the comparison use case (a parameter so a test can count its calls).
 */
export async function buildReportData(
  em: EntityManager,
  actor: Actor,
  comparisonId: string,
  meta: { number: string; version: number; createdAt: Date; technicianNote: string | null },
  evaluate: EvaluateComparison = evaluateComparison,
): Promise<{ data: ReportData; preview: ComparisonPreview; shop: Shop; bike: Bike }> {
  const comparison = await findComparison(em, actor, comparisonId);
  const shop = await em.findOneOrFail(Shop, actor.shopId);
  const options = { ...(comparison.options as ComparisonOptions), units: shop.units === 'metric' ? 'kw-nm' : 'hp-lbft' } as ComparisonOptions;
  let preview: ComparisonPreview;
  try {
    preview = await evaluate(em, actor, savedInput(comparison, options));
  } catch (e) {
    const why = previewErrorOf(e);
    if (why) throw new AppError('COMPARISON_NOT_COMPUTABLE', `This comparison cannot be reported on: ${why.message}`, 422);
    throw e;
  }
  const bike = await em.findOneOrFail(Bike, { id: comparison.bike.id, shop: actor.shopId }, { populate: ['customer'] });
  const dynoIds = [...new Set(preview.runs.map((r) => r.dynoId).filter((d): d is string => !!d))];
  const dynos = dynoIds.length ? await em.find(Dyno, { id: { $in: dynoIds }, shop: actor.shopId }) : [];
  const last = preview.results[preview.results.length - 1];
  const { stages, cost } = await stagesOf(em, actor, preview, last?.runId ?? null);

  const data: ReportData = {
    number: meta.number,
    version: meta.version,
    createdAt: meta.createdAt.toISOString(),
    shop: { name: shop.name, address: shop.address, phone: shop.phone, email: shop.email },
    units: shop.units,
    paperSize: shop.paperSize,
    timeZone: shop.timeZone,
    customer: { name: bike.customer.name },
    bike: { make: bike.make, model: bike.model, year: bike.year, vin: bike.vin, engineFamily: bike.engineFamily, displacementCc: bike.displacementCc },
    comparison: { id: comparison.id, name: comparison.name },
    runs: preview.runs.map((r, i) => {
      const dyno = dynos.find((d) => d.id === r.dynoId);
      return {
        id: r.runId,
        label: r.name,
        fileName: r.fileName,
        stageName: r.stageName,
        isBaseline: r.runId === preview.baseline.runId,
        colorIndex: r.colorIndex ?? i,
        recordedAt: r.recordedAt,
        dynoName: r.dynoName,
        dynoKind: dyno ? KIND_LABEL[dyno.kind] ?? dyno.kind : null,
        conditions: r.conditions,
        correctionStandard: r.correction.standard,
        correctionLabel: standardLabel(r.correction.standard),
        correctionFactor: r.correction.standard === 'none' ? null : r.correction.factor,
        peakPower: r.peakPower,
        peakTorque: r.peakTorque,
      };
    }),
    gains: preview.results.map((g) => ({
      runId: g.runId,
      peakPowerGain: g.peakPowerGain,
      peakTorqueGain: g.peakTorqueGain,
      areaGainPct: g.areaGainPct,
      averagePowerGainHp: g.averagePowerGainHp,
      bands: g.bands.map((b) => ({ from: b.from, to: b.to, averagePowerGainHp: b.averagePowerGainHp })),
      largestGain: g.largestGain,
      largestLoss: g.largestLoss,
    })),
    curves: curvesOf(preview),
    stages,
    repeatability: repeatabilityText(preview, shop.units),
    cost: last && cost ? { ...cost, gainHp: last.peakPowerGain.hp } : null,
    warnings: preview.warnings.map((w) => w.message),
    summary: preview.summary.join(' '),
    technicianNote: meta.technicianNote,
  };
  return { data, preview, shop, bike };
}
