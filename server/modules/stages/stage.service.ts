import type { EntityManager } from '@mikro-orm/postgresql';
import type { z } from 'zod';
import type { Actor } from '../../http/actor';
import { AppError, notFound } from '../../lib/errors';
import { tenantScope } from '../../http/tenant-scope';
import { wholePage, type Page } from '@shared/schemas/common';
import type { PartDto, StageDto, partInput, stageInput, stageUpdateInput } from '@shared/schemas/run';
import { Part, Stage } from './stage.entity';
import { Shop } from '../shops/shop.entity';
import { Run } from '../runs/run.entity';
import { getBikeEntity } from '../bikes/bike.service';
import { recordAudit } from '../audit/audit.service';
import { refreshBikeOutcomes } from '../builds/build-outcome.service';

type StageInput = z.output<typeof stageInput>;
type StageUpdateInput = z.output<typeof stageUpdateInput>;
type PartInput = z.output<typeof partInput>;

/**
 * Dollars as entered → whole cents, half a cent rounding up. The product is first cut to 6
 * decimals so binary noise (1.005 × 100 = 100.49999…) does not round the entered value down.
 */
export const toCents = (dollars: number | null | undefined) => (dollars == null ? 0 : Math.round(Number((dollars * 100).toFixed(6))));

const toPartDto = (p: Part): PartDto => ({
  id: p.id,
  category: p.category,
  description: p.description,
  partCostCents: p.partCostCents,
  labourCostCents: p.labourCostCents,
  headWorkLevel: p.headWorkLevel,
});

function partFields(input: PartInput, index = 0) {
  return {
    // Parts keep the order they were entered in (createdAt breaks ties within one request).
    createdAt: new Date(Date.now() + index),
    category: input.category,
    description: input.description,
    partCostCents: toCents(input.partCost),
    labourCostCents: toCents(input.labourCost),
    // Head-work level is only meaningful for cylinder-head work (the build finder searches it).
    headWorkLevel: input.category === 'cylinder-heads' ? (input.headWorkLevel ?? null) : null,
  };
}

/** A bike's stages in build order, with parts, costs, reference runs and run counts. */
export async function listStages(em: EntityManager, actor: Actor, bikeId: string): Promise<Page<StageDto>> {
  await getBikeEntity(em, actor, bikeId); // 404 for another shop's or another customer's bike
  const stages = await em.find(Stage, tenantScope<Stage>(actor, undefined, { bike: bikeId }), { orderBy: { position: 'asc', createdAt: 'asc' } });
  return wholePage(await toStageDtos(em, stages));
}

export async function toStageDtos(em: EntityManager, stages: Stage[]): Promise<StageDto[]> {
  if (!stages.length) return [];
  const ids = stages.map((s) => s.id);
  const parts = await em.find(Part, { stage: { $in: ids } }, { orderBy: { createdAt: 'asc', id: 'asc' } });
  // shop_id first: the (shop_id, stage_id) index, not a scan of every run in the archive.
  const counts = (await em.getConnection().execute(
    `select stage_id, count(*)::int as n from run where shop_id = ? and stage_id in (${ids.map(() => '?').join(',')}) and deleted_at is null group by stage_id`,
    [stages[0].shop.id, ...ids],
  )) as { stage_id: string; n: number }[];
  const countOf = new Map(counts.map((c) => [c.stage_id, Number(c.n)]));
  return stages.map((s) => ({
    id: s.id,
    bikeId: s.bike.id,
    position: s.position,
    name: s.name,
    date: s.date,
    description: s.description,
    parts: parts.filter((p) => p.stage.id === s.id).map(toPartDto),
    totalCostCents: s.totalCostCents,
    referenceRunId: s.referenceRun?.id ?? null,
    runCount: countOf.get(s.id) ?? 0,
    gainPeakPowerHp: s.gainPeakPowerHp,
    gainAreaPct: s.gainAreaPct,
    gainAveragePowerHp: s.gainAveragePowerHp,
  }));
}

async function stageDto(em: EntityManager, stage: Stage): Promise<StageDto> {
  await em.refresh(stage);
  return (await toStageDtos(em, [stage]))[0];
}

/** A stage of the actor's shop (customers: of their own bikes), or 404. */
export async function getStageEntity(em: EntityManager, actor: Actor, id: string): Promise<Stage> {
  const stage = await em.findOne(Stage, tenantScope<Stage>(actor, 'bike.customer', { id }));
  if (!stage) throw notFound('Stage');
  return stage;
}

export async function getStage(em: EntityManager, actor: Actor, id: string): Promise<StageDto> {
  return (await toStageDtos(em, [await getStageEntity(em, actor, id)]))[0];
}

export async function createStage(em: EntityManager, actor: Actor, input: StageInput): Promise<StageDto> {
  const stage = await em.transactional(async (tx) => {
    const bike = await getBikeEntity(tx, actor, input.bikeId);
    const last = await tx.findOne(Stage, { bike: bike.id }, { orderBy: { position: 'desc' } });
    const shop = tx.getReference(Shop, actor.shopId);
    const created = tx.create(Stage, { shop, bike, position: last ? last.position + 1 : 0, name: input.name, date: input.date ?? null, description: input.description } as Stage);
    input.parts.forEach((p, i) => tx.create(Part, { shop, stage: created, ...partFields(p, i) } as Part));
    await tx.flush();
    await refreshBikeOutcomes(tx, bike.id);
    await recordAudit(tx, actor, 'stage.create', 'stage', created.id, { bikeId: bike.id, name: created.name, parts: input.parts.length });
    return created;
  });
  return stageDto(em, stage);
}

export async function updateStage(em: EntityManager, actor: Actor, id: string, input: StageUpdateInput): Promise<StageDto> {
  const stage = await em.transactional(async (tx) => {
    const found = await getStageEntity(tx, actor, id);
    if (input.name !== undefined) found.name = input.name;
    if (input.date !== undefined) found.date = input.date ?? null;
    if (input.description !== undefined) found.description = input.description;
    if (input.parts !== undefined) {
      // The list given replaces the stage's parts.
      await tx.nativeDelete(Part, { stage: found.id });
      input.parts.forEach((p, i) => tx.create(Part, { shop: tx.getReference(Shop, actor.shopId), stage: found, ...partFields(p, i) } as Part));
    }
    await tx.flush();
    await refreshBikeOutcomes(tx, found.bike.id);
    await recordAudit(tx, actor, 'stage.update', 'stage', found.id, { name: input.name, date: input.date, parts: input.parts?.length });
    return found;
  });
  return stageDto(em, stage);
}

/** Removes a stage and its parts; its runs stay in the archive with no stage. */
export async function deleteStage(em: EntityManager, actor: Actor, id: string): Promise<void> {
  await em.transactional(async (tx) => {
    const stage = await getStageEntity(tx, actor, id);
    const bikeId = stage.bike.id;
    const detached = await tx.nativeUpdate(Run, { stage: stage.id }, { stage: null });
    await tx.nativeDelete(Part, { stage: stage.id });
    await tx.remove(stage).flush();
    tx.clear();
    await refreshBikeOutcomes(tx, bikeId);
    await recordAudit(tx, actor, 'stage.delete', 'stage', id, { bikeId, name: stage.name, runsDetached: detached });
  });
}

/** Puts a bike's stages in the given order; the list must be exactly the bike's stages. */
export async function reorderStages(em: EntityManager, actor: Actor, input: { bikeId: string; stageIds: string[] }): Promise<Page<StageDto>> {
  await em.transactional(async (tx) => {
    await getBikeEntity(tx, actor, input.bikeId);
    const stages = await tx.find(Stage, tenantScope<Stage>(actor, undefined, { bike: input.bikeId }));
    const byId = new Map(stages.map((s) => [s.id, s]));
    const unique = new Set(input.stageIds);
    if (unique.size !== input.stageIds.length || unique.size !== stages.length || input.stageIds.some((id) => !byId.has(id))) {
      throw new AppError('STAGE_ORDER_INVALID', 'List every stage of this bike exactly once', 400);
    }
    input.stageIds.forEach((id, i) => (byId.get(id)!.position = i));
    await tx.flush();
    await refreshBikeOutcomes(tx, input.bikeId);
    await recordAudit(tx, actor, 'stage.reorder', 'bike', input.bikeId, { stageIds: input.stageIds });
  });
  return listStages(em, actor, input.bikeId);
}

/** Choose (or clear) the run that represents a stage; the run is tagged with the stage. */
export async function setReferenceRun(em: EntityManager, actor: Actor, id: string, runId: string | null): Promise<StageDto> {
  const stage = await em.transactional(async (tx) => {
    const found = await getStageEntity(tx, actor, id);
    if (runId) {
      const run = await tx.findOne(Run, tenantScope<Run>(actor, undefined, { id: runId, bike: found.bike.id, deletedAt: null }));
      if (!run) throw notFound('Run');
      if (run.status !== 'ready') throw new AppError('RUN_NOT_READY', 'Only a run with a usable curve can represent a stage; map or re-process it first', 409);
      // A run represents one stage at most.
      const others = await tx.find(Stage, { referenceRun: run.id, id: { $ne: found.id } });
      for (const o of others) o.referenceRun = null;
      found.referenceRun = run;
      run.stage = found;
    } else found.referenceRun = null;
    await tx.flush();
    await refreshBikeOutcomes(tx, found.bike.id);
    await recordAudit(tx, actor, 'stage.reference-run', 'stage', found.id, { runId });
    return found;
  });
  return stageDto(em, stage);
}

export async function addPart(em: EntityManager, actor: Actor, stageId: string, input: PartInput): Promise<StageDto> {
  const stage = await em.transactional(async (tx) => {
    const found = await getStageEntity(tx, actor, stageId);
    const part = tx.create(Part, { shop: tx.getReference(Shop, actor.shopId), stage: found, ...partFields(input) } as Part);
    await tx.flush();
    await refreshBikeOutcomes(tx, found.bike.id);
    await recordAudit(tx, actor, 'part.create', 'part', part.id, { stageId, category: part.category, partCostCents: part.partCostCents, labourCostCents: part.labourCostCents });
    return found;
  });
  return stageDto(em, stage);
}

async function partOf(em: EntityManager, actor: Actor, stageId: string, partId: string) {
  const stage = await getStageEntity(em, actor, stageId);
  const part = await em.findOne(Part, tenantScope<Part>(actor, undefined, { id: partId, stage: stage.id }));
  if (!part) throw notFound('Part');
  return { stage, part };
}

export async function updatePart(em: EntityManager, actor: Actor, stageId: string, partId: string, input: PartInput): Promise<StageDto> {
  const stage = await em.transactional(async (tx) => {
    const { stage: found, part } = await partOf(tx, actor, stageId, partId);
    const { createdAt: _keepOrder, ...fields } = partFields(input);
    tx.assign(part, fields);
    await tx.flush();
    await refreshBikeOutcomes(tx, found.bike.id);
    await recordAudit(tx, actor, 'part.update', 'part', part.id, { stageId, ...fields });
    return found;
  });
  return stageDto(em, stage);
}

export async function deletePart(em: EntityManager, actor: Actor, stageId: string, partId: string): Promise<StageDto> {
  const stage = await em.transactional(async (tx) => {
    const { stage: found, part } = await partOf(tx, actor, stageId, partId);
    await tx.remove(part).flush();
    await refreshBikeOutcomes(tx, found.bike.id);
    await recordAudit(tx, actor, 'part.delete', 'part', partId, { stageId, description: part.description });
    return found;
  });
  return stageDto(em, stage);
}
