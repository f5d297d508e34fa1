/**
 * Use case: a bike's runs for the comparison builder, newest first, and the default suggestion:
 * the reference run of the previous stage against the reference run of the latest stage; with
 * fewer than two references chosen, each stage's newest ready run stands in for it (so a baseline
 * and a stage 1 just uploaded and tagged are compared without a click); else the two newest runs.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { tenantScope } from '../../http/tenant-scope';
import { notFound } from '../../lib/errors';
import type { CandidatesDto } from '@shared/schemas/comparison';
import { Run } from '../runs/run.entity';
import { Stage } from '../stages/stage.entity';
import { Bike } from '../bikes/bike.entity';
import { bikeLabel, runName } from './engine';
import { runFileLabel } from '@shared/labels';

export async function comparisonCandidates(em: EntityManager, actor: Actor, query: { bikeId: string }): Promise<CandidatesDto> {
  const bike = await em.findOne(Bike, tenantScope<Bike>(actor, 'customer', { id: query.bikeId }));
  if (!bike) throw notFound('Bike');
  const [runs, stages] = await Promise.all([
    em.find(Run, { shop: actor.shopId, bike, deletedAt: null }, { populate: ['stage', 'session'], orderBy: { createdAt: 'desc' }, limit: 300 }),
    em.find(Stage, { shop: actor.shopId, bike }, { orderBy: { position: 'asc', createdAt: 'asc' } }),
  ]);
  const refs = new Set(stages.map((s) => s.referenceRun?.id).filter(Boolean));
  const ready = new Map(runs.filter((r) => r.status === 'ready').map((r) => [r.id, r]));
  const refStages = stages.filter((s) => s.referenceRun && ready.has(s.referenceRun.id));
  // Each stage's representative: its reference run when ready, else its newest ready run.
  const represented = stages.flatMap((s) => {
    const ref = s.referenceRun && ready.has(s.referenceRun.id) ? s.referenceRun.id : null;
    const newest = ref ?? [...ready.values()].find((r) => r.stage?.id === s.id)?.id;
    return newest ? [newest] : [];
  });
  let suggestion: CandidatesDto['suggestion'] = null;
  if (refStages.length >= 2) {
    const [prev, cur] = refStages.slice(-2);
    suggestion = { baselineRunId: prev.referenceRun!.id, runIds: [prev.referenceRun!.id, cur.referenceRun!.id] };
  } else if (represented.length >= 2) {
    // Runs tagged but no reference chosen yet: the previous stage against the latest, all the same.
    const [prev, cur] = represented.slice(-2);
    suggestion = { baselineRunId: prev, runIds: [prev, cur] };
  } else {
    const newest = [...ready.values()].slice(0, 2).reverse();
    if (newest.length === 2) suggestion = { baselineRunId: newest[0].id, runIds: newest.map((r) => r.id) };
  }
  return {
    bikeId: bike.id,
    bikeLabel: bikeLabel(bike),
    runs: runs.map((r) => ({
      id: r.id,
      name: runName(r),
      fileName: runFileLabel(r),
      status: r.status,
      stageId: r.stage?.id ?? null,
      stageName: r.stage?.name ?? null,
      stagePosition: r.stage?.position ?? null,
      isReference: refs.has(r.id),
      recordedAt: (r.session?.startedAt ?? r.createdAt).toISOString(),
      peakPowerHp: r.peakPowerHp,
      peakPowerRpm: r.peakPowerRpm,
      peakTorqueLbft: r.peakTorqueLbft,
      rpmMin: r.rpmMin,
      rpmMax: r.rpmMax,
      correctionStandard: r.correctionStandard,
      identityStatus: r.identityStatus,
    })),
    suggestion,
  };
}
