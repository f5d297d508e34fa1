/** Use cases: a bike's plans, one plan, its sent versions, and the PDF of the version sent last. */
import type { EntityManager } from '@mikro-orm/postgresql';
import { wholePage, type Page } from '@shared/schemas/common';
import type { PlanDto, PlanVersionDto } from '@shared/schemas/plans';
import type { Actor } from '../../http/actor';
import type { AppDeps } from '../../app-deps';
import { tenantScope } from '../../http/tenant-scope';
import { notFound } from '../../lib/errors';
import { getBikeEntity } from '../bikes/bike.service';
import { Plan, PlanVersion } from './plan.entity';
import { findPlan, toPlanDto } from './plan-access';

export async function listBikePlans(em: EntityManager, actor: Actor, bikeId: string): Promise<Page<PlanDto>> {
  await getBikeEntity(em, actor, bikeId); // 404 for another shop's or another customer's bike
  const extra: Record<string, unknown> = { bike: bikeId };
  if (actor.role === 'customer') extra.status = { $ne: 'draft' };
  const plans = await em.find(Plan, tenantScope<Plan>(actor, 'bike.customer', extra), { orderBy: { createdAt: 'desc' }, populate: ['bike', 'bike.customer', 'convertedStage'] as never[] });
  const items: PlanDto[] = [];
  for (const p of plans) items.push(await toPlanDto(em, p));
  return wholePage(items);
}

export async function getPlan(em: EntityManager, actor: Actor, id: string): Promise<PlanDto> {
  return toPlanDto(em, await findPlan(em, actor, id));
}

export async function listPlanVersions(em: EntityManager, actor: Actor, id: string): Promise<Page<PlanVersionDto>> {
  const plan = await findPlan(em, actor, id);
  const rows = await em.find(PlanVersion, { shop: actor.shopId, plan: plan.id }, { orderBy: { version: 'desc' } });
  return wholePage(rows.map((v) => ({ version: v.version, sentAt: v.createdAt.toISOString(), sentTo: v.sentTo, totalCostCents: v.totalCostCents, depositCents: v.depositCents })));
}

/** The quote PDF of the plan's current version (what the customer was sent). */
export async function planPdf(deps: AppDeps, em: EntityManager, plan: Plan) {
  const v = await em.findOne(PlanVersion, { plan: plan.id, version: plan.version });
  if (!v) throw notFound('Plan PDF');
  return { fileName: `build-plan-v${v.version}.pdf`, stream: await deps.storage.getStream(v.pdfKey) };
}
