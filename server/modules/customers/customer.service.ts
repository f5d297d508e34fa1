import type { EntityManager } from '@mikro-orm/postgresql';
import type { FilterQuery } from '@mikro-orm/core';
import type { Actor } from '../../http/actor';
import { AppError, notFound } from '../../lib/errors';
import { customerFilterOf, tenantScope } from '../../http/tenant-scope';
import { containsPattern } from '../../db/sql-text';
import { parseSort, type Page } from '@shared/schemas/common';
import type { CustomerDto } from '@shared/schemas/customer';
import type { z } from 'zod';
import type { customerInput, customerListQuery } from '@shared/schemas/customer';
import { Customer } from './customer.entity';
import { Shop } from '../shops/shop.entity';
import { Bike } from '../bikes/bike.entity';
import { User } from '../users/user.entity';
import { recordAudit } from '../audit/audit.service';
import { PendingInvite } from '../users/pending-invite.entity';
import { boundedTotal, wholeListOnFirstPage } from '../../db/bounded-total';

type CustomerData = z.output<typeof customerInput>;
type ListQuery = z.output<typeof customerListQuery>;

async function decorate(em: EntityManager, customers: Customer[]): Promise<CustomerDto[]> {
  if (!customers.length) return [];
  const ids = customers.map((c) => c.id);
  // shop_id first: the (shop_id, customer_id) index, not a scan of every bike.
  const counts = (await em.getConnection().execute(
    `select customer_id, count(*)::int as n from bike where shop_id = ? and customer_id in (${ids.map(() => '?').join(',')}) group by customer_id`,
    [customers[0].shop.id, ...ids],
  )) as { customer_id: string; n: number }[];
  const portal = await em.find(User, { customer: { $in: ids } }, { fields: ['customer'] });
  // An invitation to an address of another shop counts as one, as any invitation does.
  const pending = await em.find(PendingInvite, { customer: { $in: ids } }, { fields: ['customer'] });
  const bikeCount = new Map(counts.map((r) => [r.customer_id, r.n]));
  const withPortal = new Set([...portal, ...pending].map((u) => u.customer?.id));
  return customers.map((c) => ({
    id: c.id,
    name: c.name,
    email: c.email,
    phone: c.phone,
    notes: c.notes,
    bikeCount: bikeCount.get(c.id) ?? 0,
    hasPortalAccess: withPortal.has(c.id),
    createdAt: c.createdAt.toISOString(),
  }));
}

/** The shop's customers, searched by name, e-mail or phone, sorted and paged on the server. */
export async function listCustomers(em: EntityManager, actor: Actor, query: ListQuery): Promise<Page<CustomerDto>> {
  const where = tenantScope<Customer>(actor) as FilterQuery<Customer> & Record<string, unknown>;
  if (query.q) {
    const like = containsPattern(query.q);
    where.$or = [{ name: { $ilike: like } }, { email: { $ilike: like } }, { phone: { $ilike: like } }];
  }
  const { field, dir } = parseSort(query.sort, 'name');
  const offset = (query.page - 1) * query.pageSize;
  const rows = await em.find(Customer, where, {
    // The tie-break runs the same way as the sort, so (shop_id, field, id) serves it from either end.
    orderBy: { [field]: dir, id: dir },
    limit: query.pageSize,
    offset,
  });
  // Exact up to one largest page, else the planner's estimate (said so), as the other lists.
  const params: unknown[] = [actor.shopId];
  let fromWhere = 'from customer c where c.shop_id = ?';
  if (query.q) {
    const like = containsPattern(query.q);
    fromWhere += ' and (c.name ilike ? or c.email ilike ? or c.phone ilike ?)';
    params.push(like, like, like);
  }
  const column = { name: 'name', createdAt: 'created_at', email: 'email' }[field] ?? 'name';
  const { total, exact } =
    wholeListOnFirstPage(offset, rows.length, query.pageSize) ??
    (await boundedTotal(em, fromWhere, params, { atLeast: offset + rows.length, orderBy: `c.${column} ${dir}, c.id ${dir}` }));
  return { items: await decorate(em, rows), total, ...(exact ? {} : { totalIsEstimate: true }), page: query.page, pageSize: query.pageSize };
}

export async function getCustomerEntity(em: EntityManager, actor: Actor, id: string): Promise<Customer> {
  const customer = await em.findOne(Customer, tenantScope<Customer>(actor, undefined, { id }));
  // A customer reaches only their own record.
  const own = customerFilterOf(actor);
  if (!customer || (own !== null && own !== id)) throw notFound('Customer');
  return customer;
}

export async function getCustomer(em: EntityManager, actor: Actor, id: string): Promise<CustomerDto> {
  const [dto] = await decorate(em, [await getCustomerEntity(em, actor, id)]);
  return dto;
}

export async function createCustomer(em: EntityManager, actor: Actor, data: CustomerData): Promise<CustomerDto> {
  const customer = await em.transactional(async (tx) => {
    const created = tx.create(Customer, { ...data, shop: tx.getReference(Shop, actor.shopId) } as Customer);
    await recordAudit(tx, actor, 'customer.create', 'customer', created.id, { name: created.name });
    return created;
  });
  return (await decorate(em, [customer]))[0];
}

export async function updateCustomer(em: EntityManager, actor: Actor, id: string, data: CustomerData): Promise<CustomerDto> {
  const customer = await em.transactional(async (tx) => {
    const found = await getCustomerEntity(tx, actor, id);
    tx.assign(found, data);
    await recordAudit(tx, actor, 'customer.update', 'customer', found.id, data);
    return found;
  });
  return (await decorate(em, [customer]))[0];
}

export async function deleteCustomer(em: EntityManager, actor: Actor, id: string): Promise<void> {
  await em.transactional(async (tx) => {
    const customer = await getCustomerEntity(tx, actor, id);
    const bikes = await tx.count(Bike, { customer });
    if (bikes > 0) {
      throw new AppError('CUSTOMER_HAS_BIKES', `This customer still has ${bikes} bike(s); move or remove them first`, 409);
    }
    tx.remove(customer);
    await recordAudit(tx, actor, 'customer.delete', 'customer', id, { name: customer.name });
  });
}
