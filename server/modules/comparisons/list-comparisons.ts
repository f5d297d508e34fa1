/**
 * The saved-comparison list's read model: one SQL statement for the rows (no entity hydration),
 * newest first; index comparison_list_created (Migration20261202171000).
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { tenantParams } from '../../http/tenant-scope';
import type { ComparisonDto, ComparisonOptions } from '@shared/schemas/comparison';
import { bikeLabel } from '@shared/labels';
import { Sql } from '../builds/build-sql';

/** At most this many comparisons per answer (as before). */
export const COMPARISON_LIST_LIMIT = 500;

interface ComparisonListRow {
  id: string;
  name: string;
  bike_id: string;
  make: string;
  model: string;
  year: number | null;
  run_ids: string[];
  baseline_run_id: string;
  options: ComparisonOptions;
  note: string | null;
  created_at: Date | string;
  created_by_name: string | null;
}

export function comparisonListSql(actor: Actor, query: { bikeId?: string }): { sql: string; params: unknown[] } {
  const s = new Sql();
  const { shopId, customerId } = tenantParams(actor);
  const and = [`c.shop_id = ${s.p(shopId)}`];
  if (customerId !== null) and.push(`b.customer_id = ${s.p(customerId)}`);
  if (query.bikeId) and.push(`c.bike_id = ${s.p(query.bikeId)}`);
  const sql = `select c.id, c.name, c.bike_id, b.make, b.model, b.year, c.run_ids, c.baseline_run_id, c.options, c.note, c.created_at, u.name as created_by_name
    from comparison c join bike b on b.id = c.bike_id left join app_user u on u.id = c.created_by_id
   where ${and.join(' and ')}
   order by c.created_at desc, c.id
   limit ${s.p(COMPARISON_LIST_LIMIT)}`;
  return { sql, params: s.params };
}

export async function listComparisons(em: EntityManager, actor: Actor, query: { bikeId?: string }): Promise<ComparisonDto[]> {
  const { sql, params } = comparisonListSql(actor, query);
  const rows = (await em.getConnection().execute(sql, params)) as ComparisonListRow[];
  return rows.map((c) => ({
    id: c.id,
    name: c.name,
    bikeId: c.bike_id,
    bikeLabel: bikeLabel(c),
    runIds: c.run_ids,
    baselineRunId: c.baseline_run_id,
    options: c.options,
    note: c.note,
    createdAt: (c.created_at instanceof Date ? c.created_at : new Date(c.created_at)).toISOString(),
    createdByName: c.created_by_name,
  }));
}
