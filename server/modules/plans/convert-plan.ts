/**
 * Use case: the work of an accepted plan is done: it becomes the bike's next stage with the
 * plan's items as its parts (costs in cents as quoted). When that stage's runs come in and it
 * gets a reference run, the plan shows predicted against measured (plan-access.ts).
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { z } from 'zod';
import type { PlanDto, planConvertInput } from '@shared/schemas/plans';
import type { Actor } from '../../http/actor';
import { recordAudit } from '../audit/audit.service';
import { refreshBikeOutcomes } from '../builds/build-outcome.service';
import { Shop } from '../shops/shop.entity';
import { Part, Stage } from '../stages/stage.entity';
import { Plan } from './plan.entity';
import { findPlan, requireStatus, toPlanDto } from './plan-access';

export async function convertPlan(em: EntityManager, actor: Actor, id: string, input: z.output<typeof planConvertInput>): Promise<PlanDto> {
  const plan = await findPlan(em, actor, id);
  requireStatus(plan, ['accepted'], 'turned into a stage (only an accepted plan can be)');
  await em.transactional(async (tx) => {
    const p = await tx.findOneOrFail(Plan, plan.id, { populate: ['bike'] });
    requireStatus(p, ['accepted'], 'turned into a stage');
    const last = await tx.findOne(Stage, { bike: p.bike.id }, { orderBy: { position: 'desc' } });
    const shop = tx.getReference(Shop, actor.shopId);
    const stage = tx.create(Stage, {
      shop,
      bike: p.bike,
      position: last ? last.position + 1 : 0,
      name: (input.name ?? p.title).slice(0, 120),
      date: input.date ?? new Date().toISOString().slice(0, 10),
      description: `From build plan v${p.acceptedVersion ?? p.version}, accepted by ${p.acceptedName ?? 'the customer'}.`,
    } as Stage);
    p.items.forEach((item, i) =>
      tx.create(Part, {
        shop,
        stage,
        createdAt: new Date(Date.now() + i),
        category: item.category,
        description: item.description,
        partCostCents: item.partCostCents,
        labourCostCents: item.labourCostCents,
        headWorkLevel: item.category === 'cylinder-heads' ? item.headWork : null,
      } as Part),
    );
    Object.assign(p, { status: 'converted', convertedStage: stage, updatedAt: new Date() });
    await tx.flush();
    await refreshBikeOutcomes(tx, p.bike.id);
    await recordAudit(tx, actor, 'plan.convert', 'plan', p.id, { stageId: stage.id, parts: p.items.length });
    await recordAudit(tx, actor, 'stage.create', 'stage', stage.id, { bikeId: p.bike.id, name: stage.name, parts: p.items.length, planId: p.id });
  });
  em.clear();
  return toPlanDto(em, await findPlan(em, actor, id));
}
