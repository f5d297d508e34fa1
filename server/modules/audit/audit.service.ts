import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { AuditEntry } from './audit-entry.entity';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';
import type { AuditEntryDto } from '@shared/schemas/auth';

/** Append one line to the shop's audit log. */
export async function recordAudit(em: EntityManager, actor: Actor, action: string, entityType: string, entityId: string, details?: Record<string, unknown>) {
  em.create(AuditEntry, {
    shop: em.getReference(Shop, actor.shopId),
    user: em.getReference(User, actor.id),
    action,
    entityType,
    entityId,
    details: details ?? null,
  } as AuditEntry);
  await em.flush();
}


/** The newest entries; `kinds` narrows to actions whose first part is one of them ("run" → run.upload, run.delete…). */
export async function listAudit(em: EntityManager, actor: Actor, opts: { before?: string; limit: number; kinds?: string[] }): Promise<AuditEntryDto[]> {
  const rows = await em.find(
    AuditEntry,
    {
      shop: actor.shopId,
      ...(opts.before ? { createdAt: { $lt: new Date(opts.before) } } : {}),
      ...(opts.kinds?.length ? { $or: opts.kinds.map((k) => ({ action: { $like: `${k}.%` } })) } : {}),
    },
    { orderBy: { createdAt: 'desc' }, limit: opts.limit, populate: ['user'] },
  );
  return rows.map((r) => ({
    id: r.id,
    at: r.createdAt.toISOString(),
    userName: r.user?.name ?? null,
    action: r.action,
    entityType: r.entityType,
    entityId: r.entityId,
    details: r.details,
  }));
}
