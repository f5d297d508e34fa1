/**
 * The one tenant scope. Every query is limited to the actor's shop; a customer is further limited
 * to their own records, reached through the path to the owning customer (`'customer'` on a bike,
 * `'bike.customer'` on a run, session, stage, comparison or report). Rows outside the scope are
 * simply not found (404), never "forbidden", so their existence does not leak.
 */
import type { FilterQuery } from '@mikro-orm/core';
import type { Actor } from './actor';

/**
 * Stands in for a customer id when a customer account is not linked to a customer record:
 * matches nothing, so such an account sees no bikes rather than every bike.
 */
export const NO_CUSTOMER = '00000000-0000-0000-0000-000000000000';

/** The customer id a customer actor may see (NO_CUSTOMER when unlinked); null for staff, who see the whole shop. */
export function customerFilterOf(actor: Actor): string | null {
  return actor.role === 'customer' ? (actor.customerId ?? NO_CUSTOMER) : null;
}

/**
 * ORM filter for entities with a `shop` relation. `customerPath` is the dotted path from the
 * entity to its customer; leave it out for records customers never read through this query.
 */
export function tenantScope<T>(actor: Actor, customerPath?: string, extra: Record<string, unknown> = {}): FilterQuery<T> {
  // The actor's shop always wins over a `shop` in extra.
  const where: Record<string, unknown> = { ...extra, shop: actor.shopId };
  const customer = customerFilterOf(actor);
  if (customer !== null && customerPath) {
    // Build { bike: { customer: id } } from 'bike.customer', merging into any filter already there.
    const keys = customerPath.split('.');
    let node = where;
    for (const key of keys.slice(0, -1)) {
      // Copy each level so a nested filter passed in `extra` is never changed in place.
      const next = { ...((node[key] as Record<string, unknown> | undefined) ?? {}) };
      node[key] = next;
      node = next;
    }
    node[keys[keys.length - 1]] = customer;
  }
  return where as FilterQuery<T>;
}

/**
 * The same scope for hand-written SQL: parameters for `shop_id = $n` and, for customers,
 * `customer_id = $m` (null for staff: write `($m::uuid is null or b.customer_id = $m)`).
 */
export function tenantParams(actor: Actor): { shopId: string; customerId: string | null } {
  return { shopId: actor.shopId, customerId: customerFilterOf(actor) };
}
