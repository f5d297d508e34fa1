/**
 * Use cases: the customer accepts a sent plan with their typed name, or declines it. Reached
 * signed in (the portal) or through the plan link; either way the audit log records the name,
 * the time, the IP address and the version accepted.
 */
import { LockMode } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { PlanDto } from '@shared/schemas/plans';
import type { Actor } from '../../http/actor';
import { AuditEntry } from '../audit/audit-entry.entity';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';
import { Plan } from './plan.entity';
import { findPlan, findPlanByToken, requireStatus, toPlanDto } from './plan-access';

/** Who is answering: a signed-in customer, or whoever holds the plan link. */
export type PlanViewer = { actor: Actor } | { token: string };

export async function viewerPlan(em: EntityManager, viewer: PlanViewer, id?: string): Promise<Plan> {
  return 'actor' in viewer ? findPlan(em, viewer.actor, id!) : findPlanByToken(em, viewer.token);
}

function audit(tx: EntityManager, viewer: PlanViewer, plan: Plan, action: string, details: Record<string, unknown>) {
  tx.create(AuditEntry, {
    shop: tx.getReference(Shop, plan.shop.id),
    user: 'actor' in viewer ? tx.getReference(User, viewer.actor.id) : null,
    action,
    entityType: 'plan',
    entityId: plan.id,
    details: { ...details, via: 'actor' in viewer ? 'portal' : 'plan link' },
  } as unknown as AuditEntry);
}

export async function acceptPlan(em: EntityManager, viewer: PlanViewer, id: string | undefined, name: string, ip: string): Promise<PlanDto> {
  const plan = await viewerPlan(em, viewer, id);
  requireStatus(plan, ['sent'], 'accepted');
  const at = new Date();
  await em.transactional(async (tx) => {
    const p = await tx.findOneOrFail(Plan, plan.id, { lockMode: LockMode.PESSIMISTIC_WRITE });
    requireStatus(p, ['sent'], 'accepted');
    Object.assign(p, { status: 'accepted', acceptedAt: at, acceptedName: name, acceptedIp: ip, acceptedVersion: p.version, updatedAt: at });
    audit(tx, viewer, p, 'plan.accept', { name, at: at.toISOString(), ip, version: p.version, totalCostCents: p.totalCostCents });
  });
  em.clear();
  return toPlanDto(em, await viewerPlan(em, viewer, plan.id));
}

export async function declinePlan(em: EntityManager, viewer: PlanViewer, id: string | undefined, reason: string | null, ip: string): Promise<PlanDto> {
  const plan = await viewerPlan(em, viewer, id);
  requireStatus(plan, ['sent'], 'declined');
  const at = new Date();
  await em.transactional(async (tx) => {
    const p = await tx.findOneOrFail(Plan, plan.id, { lockMode: LockMode.PESSIMISTIC_WRITE });
    requireStatus(p, ['sent'], 'declined');
    Object.assign(p, { status: 'declined', declinedAt: at, declineReason: reason, updatedAt: at });
    audit(tx, viewer, p, 'plan.decline', { reason, at: at.toISOString(), ip, version: p.version });
  });
  em.clear();
  return toPlanDto(em, await viewerPlan(em, viewer, plan.id));
}
