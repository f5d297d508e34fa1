import type { EntityManager } from '@mikro-orm/postgresql';
import { LoadStrategy, raw, type FilterQuery } from '@mikro-orm/core';
import { boundedTotal, wholeListOnFirstPage } from '../../db/bounded-total';
import type { z } from 'zod';
import type { Actor } from '../../http/actor';
import { notFound } from '../../lib/errors';
import { customerFilterOf, tenantParams, tenantScope } from '../../http/tenant-scope';
import { containsPattern } from '../../db/sql-text';
import { parseSort, wholePage, type Page } from '@shared/schemas/common';
import type { BikeDto, BikeInput, bikeListQuery } from '@shared/schemas/bike';
import { Bike } from './bike.entity';
import { Customer } from '../customers/customer.entity';
import { Shop } from '../shops/shop.entity';
import { recordAudit } from '../audit/audit.service';

type ListQuery = z.output<typeof bikeListQuery>;

export const toBikeDto = (b: Bike): BikeDto => ({
  id: b.id,
  customerId: b.customer.id,
  customerName: b.customer.name,
  make: b.make,
  model: b.model,
  year: b.year,
  vin: b.vin,
  engineFamily: b.engineFamily,
  displacementCc: b.displacementCc,
  cylinders: b.cylinders,
  notes: b.notes,
  createdAt: b.createdAt.toISOString(),
});

/** Columns of the sorts the (shop_id, column, id) list indexes serve; sorting by customer joins. */
const SORT_COLUMN: Partial<Record<string, string>> = { make: 'make', model: 'model', year: 'year', createdAt: 'created_at', displacementCc: 'displacement_cc' };

export async function listBikes(em: EntityManager, actor: Actor, query: ListQuery): Promise<Page<BikeDto>> {
  const where = tenantScope<Bike>(actor, 'customer') as FilterQuery<Bike> & Record<string, unknown>;
  const customerId = customerFilterOf(actor) ?? query.customerId ?? null;
  if (customerId) Object.assign(where, { customer: customerId });
  // bike.search_text (make, model, VIN, engine family, customer's name; kept by triggers,
  // Migration20261202232000) under one trigram index.
  const like = query.q ? containsPattern(query.q) : null;
  if (like) where[raw((alias) => `${alias}.search_text`)] = { $ilike: like };
  const { field, dir } = parseSort(query.sort, 'make');
  const orderBy = field === 'customer' ? { customer: { name: dir } } : { [field]: dir };
  const offset = (query.page - 1) * query.pageSize;
  const rows = await em.find(Bike, where, {
    populate: ['customer'],
    // The page's customers by id afterwards, not a join over every row the offset skips.
    strategy: LoadStrategy.SELECT_IN,
    // The tie-break runs the same way as the sort, so (shop_id, field, id) serves it from either end.
    orderBy: [orderBy, { id: dir }],
    limit: query.pageSize,
    offset,
  });
  // Exact up to one largest page, else the planner's estimate: a shop's 25 000 bikes are not counted per page.
  const params: unknown[] = [actor.shopId];
  let fromWhere = 'from bike b where b.shop_id = ?';
  if (customerId) {
    fromWhere += ' and b.customer_id = ?';
    params.push(customerId);
  }
  if (like) {
    fromWhere += ' and b.search_text ilike ?';
    params.push(like);
  }
  const column = SORT_COLUMN[field];
  const { total, exact } =
    wholeListOnFirstPage(offset, rows.length, query.pageSize) ??
    (await boundedTotal(em, fromWhere, params, { atLeast: offset + rows.length, orderBy: column ? `b.${column} ${dir}, b.id ${dir}` : undefined }));
  return { items: rows.map(toBikeDto), total, ...(exact ? {} : { totalIsEstimate: true }), page: query.page, pageSize: query.pageSize };
}

/** Load a bike the actor may see, or 404 (never 403: do not confirm it exists elsewhere). */
export async function getBikeEntity(em: EntityManager, actor: Actor, id: string): Promise<Bike> {
  const bike = await em.findOne(Bike, tenantScope<Bike>(actor, 'customer', { id }), { populate: ['customer'] });
  if (!bike) throw notFound('Bike');
  return bike;
}

async function customerOfShop(em: EntityManager, actor: Actor, customerId: string) {
  const customer = await em.findOne(Customer, tenantScope<Customer>(actor, undefined, { id: customerId }));
  if (!customer) throw notFound('Customer');
  return customer;
}

export async function createBike(em: EntityManager, actor: Actor, input: BikeInput): Promise<BikeDto> {
  const { customerId, ...data } = input;
  const bike = await em.transactional(async (tx) => {
    const customer = await customerOfShop(tx, actor, customerId);
    const created = tx.create(Bike, { ...data, customer, shop: tx.getReference(Shop, actor.shopId) } as Bike);
    await recordAudit(tx, actor, 'bike.create', 'bike', created.id, { make: created.make, model: created.model });
    return created;
  });
  return toBikeDto(bike);
}

export async function updateBike(em: EntityManager, actor: Actor, id: string, input: BikeInput): Promise<BikeDto> {
  const { customerId, ...data } = input;
  const bike = await em.transactional(async (tx) => {
    const found = await getBikeEntity(tx, actor, id);
    if (customerId !== found.customer.id) found.customer = await customerOfShop(tx, actor, customerId);
    tx.assign(found, data);
    await recordAudit(tx, actor, 'bike.update', 'bike', found.id, data);
    return found;
  });
  return toBikeDto(bike);
}

/** Engine families already used in this shop, most common first, for the form's suggestions. */
export async function engineFamilies(em: EntityManager, actor: Actor): Promise<Page<string>> {
  const rows = (await em.getConnection().execute(
    `select engine_family, count(*) as n from bike where shop_id = ? and engine_family is not null group by engine_family order by n desc, engine_family limit 100`,
    [tenantParams(actor).shopId],
  )) as { engine_family: string }[];
  return wholePage(rows.map((r) => r.engine_family));
}
