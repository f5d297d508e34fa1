/** Use cases: draft a plan for a bike, and edit it while it is a draft. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { PlanDto, PlanInput, PlanItemDto } from '@shared/schemas/plans';
import type { Actor } from '../../http/actor';
import { recordAudit } from '../audit/audit.service';
import { getBikeEntity } from '../bikes/bike.service';
import { Bike } from '../bikes/bike.entity';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';
import { Plan } from './plan.entity';
import { findPlan, requireStatus, toPlanDto } from './plan-access';
import { predictPlan } from './plan-prediction';

/** Items as stored: head-work level only on cylinder-head work; the total in whole cents. */
export function normaliseItems(input: PlanInput['items']): { items: PlanItemDto[]; totalCostCents: number } {
  const items = input.map((i) => ({
    category: i.category,
    description: i.description,
    partCostCents: i.partCostCents,
    labourCostCents: i.labourCostCents,
    headWork: i.category === 'cylinder-heads' ? (i.headWork ?? null) : null,
  }));
  return { items, totalCostCents: items.reduce((sum, i) => sum + i.partCostCents + i.labourCostCents, 0) };
}

export async function createPlan(em: EntityManager, actor: Actor, bikeId: string, input: PlanInput): Promise<PlanDto> {
  const bike = await getBikeEntity(em, actor, bikeId);
  const shop = await em.findOneOrFail(Shop, actor.shopId);
  const { items, totalCostCents } = normaliseItems(input.items);
  const prediction = await predictPlan(em, actor.shopId, bike.id, items, totalCostCents);
  const plan = await em.transactional(async (tx) => {
    const created = tx.create(Plan, {
      shop: tx.getReference(Shop, actor.shopId),
      bike: tx.getReference(Bike, bike.id),
      title: input.title,
      note: input.note,
      items,
      totalCostCents,
      currency: shop.currency,
      prediction,
      createdBy: tx.getReference(User, actor.id),
    } as Plan);
    await tx.flush();
    await recordAudit(tx, actor, 'plan.create', 'plan', created.id, { bikeId: bike.id, title: input.title, totalCostCents });
    return created;
  });
  return toPlanDto(em, await findPlan(em, actor, plan.id));
}

export async function updatePlan(em: EntityManager, actor: Actor, id: string, input: PlanInput): Promise<PlanDto> {
  const plan = await findPlan(em, actor, id);
  requireStatus(plan, ['draft'], 'edited (only a draft can be; a sent plan is versioned by sending it again)');
  const { items, totalCostCents } = normaliseItems(input.items);
  const prediction = await predictPlan(em, actor.shopId, plan.bike.id, items, totalCostCents);
  await em.transactional(async (tx) => {
    const p = await tx.findOneOrFail(Plan, plan.id);
    Object.assign(p, { title: input.title, note: input.note, items, totalCostCents, prediction, updatedAt: new Date() });
    await recordAudit(tx, actor, 'plan.update', 'plan', p.id, { title: input.title, totalCostCents });
  });
  em.clear();
  return toPlanDto(em, await findPlan(em, actor, id));
}

/** A sent, declined or expired plan goes back to draft for changes; the next send is a new version. */
export async function revisePlan(em: EntityManager, actor: Actor, id: string): Promise<PlanDto> {
  const plan = await findPlan(em, actor, id);
  requireStatus(plan, ['sent', 'declined', 'expired'], 'revised');
  await em.transactional(async (tx) => {
    const p = await tx.findOneOrFail(Plan, plan.id);
    Object.assign(p, { status: 'draft', linkTokenHash: null, declinedAt: null, declineReason: null, updatedAt: new Date() });
    await recordAudit(tx, actor, 'plan.revise', 'plan', p.id, { fromVersion: p.version });
  });
  em.clear();
  return toPlanDto(em, await findPlan(em, actor, id));
}
