/**
 * The bay board of one dyno (the wall tablet): what is on it, the session's pulls with their
 * corrected curves, peaks and gain over the reference run, the spread of this stage's pulls, and
 * when the dyno's sync agent was last heard from.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { tenantScope } from '../../http/tenant-scope';
import { bikeLabel, runName } from '@shared/labels';
import type { BayBoardDto, BayPullDto } from '@shared/schemas/bay';
import type { RunSummaryDto } from '@shared/schemas/run';
import { getDynoEntity } from './dyno.service';
import { Run } from '../runs/run.entity';
import { RUN_POPULATE, toRunSummaries } from '../runs/run-dto';
import { Stage } from '../stages/stage.entity';
import { DeviceToken } from '../device/device-token.entity';
import { toSessionDto } from '../sessions/session.service';
import { loadRunRows } from '../comparisons/comparison-runs';
import type { EngineRun } from '../comparisons/engine';
import { prepareReference, pullFigures, pullSpread } from './bay-figures';

/** The run each pull is drawn against: the stage's reference run, else the bike's baseline (first stage's reference, else the session's first readable pull). */
async function referenceRunId(em: EntityManager, actor: Actor, bikeId: string, stage: Stage | null, sessionRuns: Run[]): Promise<{ id: string; kind: 'stage-reference' | 'baseline' } | null> {
  if (stage?.referenceRun) return { id: stage.referenceRun.id, kind: 'stage-reference' };
  const first = await em.findOne(Stage, tenantScope<Stage>(actor, undefined, { bike: bikeId }), { orderBy: { position: 'asc' } });
  if (first?.referenceRun) return { id: first.referenceRun.id, kind: 'baseline' };
  const firstReady = sessionRuns.find((r) => r.status === 'ready');
  return firstReady ? { id: firstReady.id, kind: 'baseline' } : null;
}

export async function getBayBoard(em: EntityManager, actor: Actor, dynoId: string): Promise<BayBoardDto> {
  const dyno = await getDynoEntity(em, actor, dynoId);
  await em.populate(dyno, ['currentBike', 'currentBike.customer', 'currentSession', 'currentSession.dyno', 'currentSession.operator', 'currentSession.safetyConfirmedBy', 'currentStage'] as never);
  const activeTokens = await em.count(DeviceToken, tenantScope<DeviceToken>(actor, undefined, { dyno: dyno.id, revokedAt: null }));
  const base = { dyno: { id: dyno.id, name: dyno.name, kind: dyno.kind }, agentLastHeardAt: dyno.agentLastHeardAt?.toISOString() ?? null, activeTokens };
  const bike = dyno.currentBike;
  const session = dyno.currentSession;
  if (!bike || !session) return { ...base, current: null, reference: null, pulls: [], spread: null };
  const stage = dyno.currentStage;

  const runs = await em.find(Run, tenantScope<Run>(actor, undefined, { session: session.id, deletedAt: null }), { populate: RUN_POPULATE as never, orderBy: { sequence: 'asc', createdAt: 'asc' } });
  const ref = await referenceRunId(em, actor, bike.id, stage, runs);
  const ids = [...new Set([...runs.map((r) => r.id), ...(ref ? [ref.id] : [])])];
  const rows = new Map((await loadRunRows(em, actor, ids, [])).map((r) => [r.id, r]));
  const summaries = new Map((await toRunSummaries(em, runs)).map((s) => [s.id, s]));
  const refRow = ref ? (rows.get(ref.id) ?? null) : null;
  const reference = prepareReference(refRow);

  const pullOf = (row: EngineRun, summary: RunSummaryDto): BayPullDto => {
    const f = pullFigures(row, reference);
    return { run: summary, curve: f.curve, peakPowerHp: f.peakPowerHp, peakTorqueLbft: f.peakTorqueLbft, gain: f.gain };
  };
  const pulls = runs.flatMap((r) => {
    const row = rows.get(r.id);
    return row ? [pullOf(row, summaries.get(r.id)!)] : [];
  });
  let refDto: BayBoardDto['reference'] = null;
  if (ref && refRow && reference) {
    const refSummary = summaries.get(ref.id) ?? (await toRunSummaries(em, await em.find(Run, { id: ref.id }, { populate: RUN_POPULATE as never })))[0];
    const what = ref.kind === 'stage-reference' ? `${stage?.name ?? 'Stage'} reference` : 'Baseline';
    refDto = { kind: ref.kind, label: `${what}: ${runName(refRow)}`, pull: pullOf(refRow, refSummary) };
  }
  const stageRows = runs.filter((r) => (stage ? r.stage?.id === stage.id : true)).flatMap((r) => (rows.get(r.id) ? [rows.get(r.id)!] : []));
  const spread = pullSpread(stageRows);

  return {
    ...base,
    current: {
      bikeId: bike.id,
      bikeLabel: bikeLabel(bike),
      customerName: bike.customer.name,
      session: { ...toSessionDto(session, runs.length), conditionsToConfirm: session.conditionsToConfirm },
      stage: stage ? { id: stage.id, name: stage.name } : null,
      setAt: dyno.currentSetAt?.toISOString() ?? null,
    },
    reference: refDto,
    pulls,
    spread: spread ? { stageName: stage?.name ?? null, ...spread } : null,
  };
}
