/** Finding a plan the caller may see (staff, the bike's customer, or a plan link) and its DTO. */
import { createHash, randomBytes } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import { bikeLabel } from '@shared/labels';
import type { PlanDto, PlanOutcomeDto, PlanStatus } from '@shared/schemas/plans';
import type { Actor } from '../../http/actor';
import { tenantScope } from '../../http/tenant-scope';
import { AppError, notFound } from '../../lib/errors';
import { Plan } from './plan.entity';

export const sha256 = (b: Buffer | string) => createHash('sha256').update(b).digest('hex');

export function newPlanToken() {
  // 32 random bytes = 256 bits; base64url gives 43 characters (the same shape as report share links).
  const token = randomBytes(32).toString('base64url');
  return { token, hash: sha256(token) };
}

/** A sent plan past its validity answers 'expired' (no job needed to flip it). */
export function effectiveStatus(plan: Pick<Plan, 'status' | 'validUntil'>, now = new Date()): PlanStatus {
  if (plan.status === 'sent' && plan.validUntil && plan.validUntil <= now) return 'expired';
  return plan.status;
}

const POPULATE = ['bike', 'bike.customer', 'convertedStage'];

/** Staff see the shop's plans; a customer only their own bikes' plans, and never a draft. 404 otherwise. */
export async function findPlan(em: EntityManager, actor: Actor, id: string): Promise<Plan> {
  const extra: Record<string, unknown> = { id };
  if (actor.role === 'customer') extra.status = { $ne: 'draft' };
  const plan = await em.findOne(Plan, tenantScope<Plan>(actor, 'bike.customer', extra), { populate: POPULATE as never[] });
  if (!plan) throw notFound('Plan');
  return plan;
}

/** Unknown, withdrawn and malformed plan links all get this answer. */
export const linkNotFound = () => new AppError('NOT_FOUND', 'This plan link is not valid. It may have been replaced by a newer one; ask the shop.', 404);

export async function findPlanByToken(em: EntityManager, token: string): Promise<Plan> {
  const plan = await em.findOne(Plan, { linkTokenHash: sha256(token) }, { populate: [...POPULATE, 'shop'] as never[] });
  if (!plan || plan.status === 'draft') throw linkNotFound();
  return plan;
}

/** The converted stage's measured step (same definition as the prediction: against the earlier measured stage). */
async function outcomeOf(em: EntityManager, plan: Plan): Promise<PlanOutcomeDto | null> {
  if (!plan.convertedStage) return null;
  const [row] = (await em.getConnection().execute(
    `select (gain_peak_power_hp - coalesce(prev_gain_peak_power_hp, 0))::float8 as peak,
            (gain_average_power_hp - coalesce(prev_gain_average_power_hp, 0))::float8 as avg
       from build_index where stage_id = ?`,
    [plan.convertedStage.id],
  )) as { peak: number | null; avg: number | null }[];
  const p = plan.prediction.peakPowerGainHp;
  const median = p?.median ?? plan.prediction.estimate?.peakPowerGainHp ?? null;
  const measured = row?.peak ?? null;
  let position: PlanOutcomeDto['position'] = 'not-measured';
  if (measured !== null) position = !p ? 'no-prediction' : measured < p.q1 ? 'below' : measured > p.q3 ? 'above' : 'within';
  return {
    stageId: plan.convertedStage.id,
    stageName: plan.convertedStage.name,
    measuredPeakPowerGainHp: measured,
    measuredAveragePowerGainHp: row?.avg ?? null,
    predictedMedianPeakHp: median,
    predictedQ1PeakHp: p?.q1 ?? null,
    predictedQ3PeakHp: p?.q3 ?? null,
    position,
  };
}

export async function toPlanDto(em: EntityManager, plan: Plan): Promise<PlanDto> {
  const iso = (d: Date | null) => d?.toISOString() ?? null;
  return {
    id: plan.id,
    bikeId: plan.bike.id,
    bikeLabel: bikeLabel(plan.bike),
    customerName: plan.bike.customer.name,
    title: plan.title,
    note: plan.note,
    status: effectiveStatus(plan),
    version: plan.version,
    items: plan.items,
    totalCostCents: plan.totalCostCents,
    currency: plan.currency,
    prediction: plan.prediction,
    sentAt: iso(plan.sentAt),
    validUntil: iso(plan.validUntil),
    acceptedAt: iso(plan.acceptedAt),
    acceptedName: plan.acceptedName,
    acceptedVersion: plan.acceptedVersion,
    declinedAt: iso(plan.declinedAt),
    declineReason: plan.declineReason,
    depositCents: plan.depositCents,
    depositPaidCents: plan.depositPaidCents,
    depositRefundedCents: plan.depositRefundedCents,
    convertedStageId: plan.convertedStage?.id ?? null,
    outcome: await outcomeOf(em, plan),
    createdAt: plan.createdAt.toISOString(),
    updatedAt: plan.updatedAt.toISOString(),
  };
}

/** Refuses a change unless the plan is in one of `allowed` (409 PLAN_STATE with the current status). */
export function requireStatus(plan: Plan, allowed: readonly PlanStatus[], doing: string) {
  const status = effectiveStatus(plan);
  if (!allowed.includes(status)) {
    throw new AppError('PLAN_STATE', `This plan is ${status}; it cannot be ${doing}.`, 409, { status });
  }
}
