import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { AuditEntry } from './audit-entry.entity';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';
import type { AuditEntryDto } from '@shared/schemas/auth';
import type { Page } from '@shared/schemas/common';
import { tenantScope } from '../../http/tenant-scope';
import { boundedTotal } from '../../db/bounded-total';
import { escapeLike } from '../../db/sql-text';

/**
 * Adds one line to the shop's audit log in the caller's unit of work.
 *
 * The rule: call it with the transactional EntityManager of the `em.transactional(…)` that makes
 * the change, so the change and its audit line commit together or not at all. Inside a transaction
 * it only persists the line; the transaction's flush and commit write it with the change.
 *
 * Called outside a transaction it flushes at once, as it always did; then the line cannot undo a
 * change already flushed, so new code should not rely on that.
 */
export async function recordAudit(em: EntityManager, actor: Actor, action: string, entityType: string, entityId: string, details?: Record<string, unknown>) {
  em.create(AuditEntry, {
    shop: em.getReference(Shop, actor.shopId),
    user: em.getReference(User, actor.id),
    action,
    entityType,
    entityId,
    details: details ?? null,
  } as AuditEntry);
  if (!em.isInTransaction()) await em.flush();
}


/**
 * The newest entries, a page at a time; `kinds` narrows to actions whose first part is one of
 * them ("run" → run.upload, run.delete…). Keyset paging: `nextCursor` is the time of the last entry
 * on a full page (pass it back as `before`), null when there is nothing older. `total` counts every
 * entry matching `kinds` exactly up to 200, beyond that it is an estimate (`totalIsEstimate`).
 * `page` stays 1: keyset paging has no page numbers.
 */
export async function listAudit(em: EntityManager, actor: Actor, opts: { before?: string; limit: number; kinds?: string[] }): Promise<Page<AuditEntryDto>> {
  const byKind = opts.kinds?.length ? { $or: opts.kinds.map((k) => ({ action: { $like: `${k}.%` } })) } : {};
  const rows = await em.find(
    AuditEntry,
    tenantScope<AuditEntry>(actor, undefined, { ...(opts.before ? { createdAt: { $lt: new Date(opts.before) } } : {}), ...byKind }),
    { orderBy: { createdAt: 'desc' }, limit: opts.limit, populate: ['user'] },
  );
  // Exact up to 200 entries, else the planner's estimate (a shop's log grows with every change).
  const kindSql = opts.kinds?.length ? ` and (${opts.kinds.map(() => `action like ?`).join(' or ')})` : '';
  const { total, exact } = await boundedTotal(em, `from audit_entry where shop_id = ?${kindSql}`, [actor.shopId, ...(opts.kinds ?? []).map((k) => `${escapeLike(k)}.%`)], { atLeast: rows.length, orderBy: 'created_at desc' });
  const items = rows.map((r) => ({
    id: r.id,
    at: r.createdAt.toISOString(),
    userName: r.user?.name ?? null,
    action: r.action,
    entityType: r.entityType,
    entityId: r.entityId,
    details: r.details,
  }));
  return { items, total, ...(exact ? {} : { totalIsEstimate: true }), page: 1, pageSize: opts.limit, nextCursor: items.length === opts.limit ? items[items.length - 1].at : null };
}
