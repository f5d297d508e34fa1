/**
 * A list's total that costs at most a bounded walk: rows are counted exactly up to `limit` (one
 * page of the largest size); above that the total is the planner's row estimate for the same
 * FROM … WHERE (planning only, no scan), never less than `atLeast` (what the pages have already
 * shown). `exact` says which.
 *
 * Give `orderBy` the list's own order: the count then walks the index the page walks and stops
 * at `limit + 1` matches. Without it the planner may pick a bitmap of every row a common search
 * word matches (a trigram index is cheap in its cost model, not on the heap).
 */
import type { EntityManager } from '@mikro-orm/postgresql';

export const EXACT_TOTAL_LIMIT = 200;

/** `fromWhere`: "from … where …" with `?` placeholders bound by `params`. */
export async function boundedTotal(
  em: EntityManager,
  fromWhere: string,
  params: unknown[],
  opts: { limit?: number; atLeast?: number; orderBy?: string } = {},
): Promise<{ total: number; exact: boolean }> {
  const limit = opts.limit ?? EXACT_TOTAL_LIMIT;
  const conn = em.getConnection();
  const [{ n }] = (await conn.execute(`select count(*)::int as n from (select 1 ${fromWhere}${opts.orderBy ? ` order by ${opts.orderBy}` : ''} limit ${limit + 1}) x`, params)) as { n: number }[];
  if (n <= limit) return { total: n, exact: true };
  return estimatedTotal(em, fromWhere, params, Math.max(n, opts.atLeast ?? 0));
}

/** The planner's row estimate for `fromWhere` (planning only, no scan), never less than `atLeast`. */
export async function estimatedTotal(em: EntityManager, fromWhere: string, params: unknown[], atLeast: number): Promise<{ total: number; exact: false }> {
  const [row] = (await em.getConnection().execute(`explain (format json) select 1 ${fromWhere}`, params)) as { 'QUERY PLAN': [{ Plan: { 'Plan Rows': number } }] }[];
  return { total: Math.max(Math.round(row['QUERY PLAN'][0].Plan['Plan Rows']), atLeast), exact: false };
}

/**
 * The total without asking the database, when the first page already holds every match (it came
 * back shorter than a page, or the query fetched one row more than a page and got none): a rare
 * search then costs one statement instead of two. Null when the count is still needed.
 */
export function wholeListOnFirstPage(offset: number, shown: number, pageSize: number, more?: boolean): { total: number; exact: true } | null {
  if (offset !== 0) return null;
  const complete = more === undefined ? shown < pageSize : !more;
  return complete ? { total: shown, exact: true } : null;
}
