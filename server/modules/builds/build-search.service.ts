import type { EntityManager } from '@mikro-orm/postgresql';
import { HEAD_WORK_LEVELS } from '@shared/parts';
import { CC_PER_CUBIC_INCH } from '@shared/displacement';
import type { Actor } from '../../http/actor';
import { AppError } from '../../lib/errors';
import type { BuildSearchQuery } from '@shared/schemas/builds';
import type { BuildSearchPage } from '@shared/schemas/builds';
import { containsPattern } from '../../db/sql-text';
import { BUILD_INDEX_COLUMNS, Sql, toBuildItem, type BuildIndexRow } from './build-sql';

/**
 * Build finder search. A "build" is one stage of one bike that has measured gains against that
 * bike's baseline (stage.gain_peak_power_hp is not null — the baseline itself and unmeasured
 * stages are not builds yet).
 *
 * Semantics of the filters:
 * - engine: fuzzy — pg_trgm word similarity (`engine <% engine_family`, default threshold 0.6)
 *   or a case-insensitive substring; ranked by word_similarity when sort=similarity.
 * - make, model: case-insensitive substring (served by trigram indexes).
 * - ccMin/ccMax in cm³, ciMin/ciMax in in³ (× 16.387064, NIST SP 811); both may be given, the
 *   narrower bound wins.
 * - parts: every listed category must be present in the CUMULATIVE build — fitted at this stage
 *   or at any earlier stage of the same bike ("has a camshaft and cylinder heads"). headLevel is
 *   a minimum ("mild-port" = mild port or better, by HEAD_WORK_LEVELS order) and implies
 *   cylinder-heads.
 * - partText: substring of a part description in the cumulative build.
 * - q: PostgreSQL full-text (websearch syntax, 'english' configuration) over one document per
 *   build: the stage's name and description, the notes of the stage's (not deleted) runs, and the
 *   part descriptions of the cumulative build — all words of q must be in that document, not
 *   necessarily in the same note or part.
 * - tag: every listed tag is on one of the stage's (not deleted) runs.
 * - from/to: stage date (or the day the stage was recorded when it has no date), inclusive.
 * - customerId: bikes of that customer.
 * Everything is scoped to the caller's shop.
 *
 * Sorting is always descending with the stage id as tie-breaker, and paging is keyset: the
 * cursor carries the last row's sort key and id.
 *
 * Everything reads build_index (one row per stage with the cumulative build; see
 * Migration20261202001000), never the stage, part and run tables.
 */

type Sort = BuildSearchPage['sort'];
interface Cursor {
  s: Sort;
  k: number | string;
  id: string;
}

export function encodeCursor(c: Cursor): string {
  return Buffer.from(JSON.stringify(c), 'utf8').toString('base64url');
}

function decodeCursor(raw: string, sort: Sort): Cursor {
  try {
    const c = JSON.parse(Buffer.from(raw, 'base64url').toString('utf8')) as Cursor;
    const keyOk = sort === 'date' ? typeof c.k === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(c.k) : typeof c.k === 'number' && Number.isFinite(c.k);
    if (c.s !== sort || !keyOk || typeof c.id !== 'string' || !/^[0-9a-f-]{36}$/i.test(c.id)) throw new Error('bad');
    return c;
  } catch {
    throw new AppError('BAD_CURSOR', 'That page cursor is not valid for this search; start again from the first page', 400);
  }
}

/**
 * The search statement and its parameters (also used by the EXPLAIN test), and the statement that
 * counts every match (the same filters without the cursor and the limit).
 */
export function searchSql(actor: Actor, query: BuildSearchQuery): { sql: string; params: unknown[]; sort: Sort; countSql: string; countParams: unknown[] } {
  const sort: Sort = query.sort ?? (query.engine ? 'similarity' : 'gain');
  // Placeholders are positional: each part of the statement collects its own values, joined in text order.
  const cq = new Sql(); // the engine family CTE
  const q = new Sql(); // WHERE
  const oq = new Sql(); // cursor and limit
  const where: string[] = [`bi.shop_id = ${q.p(actor.shopId)}`, `bi.gain_peak_power_hp is not null`];

  // The fuzzy match is decided once per distinct engine family of the shop (build_family, trigram
  // index), not once per build; the builds of the matching families are then found by btree.
  const fam = query.engine
    ? `with fam as materialized (
        select f.engine_family, coalesce(word_similarity(${cq.p(query.engine)}, f.engine_family), 0)::float8 as score
          from build_family f
         where f.shop_id = ${cq.p(actor.shopId)} and (${cq.p(query.engine)} <% f.engine_family or f.engine_family ilike ${cq.p(containsPattern(query.engine))}))`
    : '';
  const scoreExpr = query.engine ? 'fam.score' : '0::float8';
  if (query.make) where.push(`bi.make ilike ${q.p(containsPattern(query.make))}`);
  if (query.model) where.push(`bi.model ilike ${q.p(containsPattern(query.model))}`);

  const mins = [query.ccMin, query.ciMin !== undefined ? query.ciMin * CC_PER_CUBIC_INCH : undefined].filter((v): v is number => v !== undefined);
  const maxs = [query.ccMax, query.ciMax !== undefined ? query.ciMax * CC_PER_CUBIC_INCH : undefined].filter((v): v is number => v !== undefined);
  if (mins.length) where.push(`bi.displacement_cc >= ${q.p(Math.max(...mins))}`);
  if (maxs.length) where.push(`bi.displacement_cc <= ${q.p(Math.min(...maxs))}`);
  if (query.cylinders !== undefined) where.push(`bi.cylinders = ${q.p(query.cylinders)}`);
  if (query.customerId) where.push(`bi.customer_id = ${q.p(query.customerId)}`);
  if (query.from) where.push(`bi.stage_date >= ${q.p(query.from)}::date`);
  if (query.to) where.push(`bi.stage_date <= ${q.p(query.to)}::date`);

  // Cumulative categories: part_keys holds each category and 'category:level' for head work.
  // No index on part_keys: a handful of categories, each common, so the filter rides along the
  // btree walks in gain, date or family order (see Migration20261202001000).
  const perFamily = !!query.engine && sort === 'similarity';
  const categories = new Set<string>(query.parts);
  if (query.headLevel) categories.add('cylinder-heads');
  if (categories.size) where.push(`bi.part_keys @> array[${q.list([...categories])}]::text[]`);
  if (query.headLevel) {
    const levels = HEAD_WORK_LEVELS.slice(HEAD_WORK_LEVELS.indexOf(query.headLevel));
    where.push(`bi.part_keys && array[${q.list(levels.map((l) => `cylinder-heads:${l}`))}]::text[]`);
  }
  // parts_text has one description a line, so a substring never spans two parts.
  if (query.partText) where.push(`bi.parts_text ilike ${q.p(containsPattern(query.partText))}`);
  if (query.tag.length) where.push(`bi.run_tags @> array[${q.list(query.tag)}]::text[]`);
  // websearch_to_tsquery(regconfig, text) is immutable: it folds to a constant the GIN index can use.
  if (query.q) where.push(`bi.search_tsv @@ websearch_to_tsquery('english', ${q.p(query.q)})`);

  const countSql = `${fam}
  select count(*)::int as n
    from build_index bi${query.engine ? ' join fam on fam.engine_family = bi.engine_family' : ''}
   where ${where.join('\n     and ')}`;
  const countParams = [...cq.params, ...q.params];

  const keyExpr = sort === 'similarity' ? 'score' : sort === 'gain' ? 'bi.gain_peak_power_hp' : 'bi.stage_date';
  if (query.cursor) {
    const c = decodeCursor(query.cursor, sort);
    const cast = sort === 'date' ? '::date' : '::float8';
    const key = sort === 'similarity' ? scoreExpr : keyExpr;
    where.push(`(${key}, bi.stage_id) < (${oq.p(c.k)}${cast}, ${oq.p(c.id)}::uuid)`);
  }
  const outerKey = sort === 'similarity' ? 'score' : sort === 'gain' ? 'gain_peak_power_hp' : 'stage_date';
  const limit = oq.p(query.limit + 1);
  let inner: string;
  if (perFamily) {
    // The score is one value per family, so the first page in (score, stage_id) order is among each
    // matching family's first rows in stage_id order: read those by index, then merge.
    const familyLimit = oq.p(query.limit + 1);
    inner = `select x.* from fam cross join lateral (
        select ${BUILD_INDEX_COLUMNS}, ${scoreExpr} as score
          from build_index bi
         where bi.engine_family = fam.engine_family
           and ${where.join('\n           and ')}
         order by bi.stage_id desc
         limit ${familyLimit}) x
     order by x.score desc, x.stage_id desc
     limit ${limit}`;
  } else {
    inner = `select ${BUILD_INDEX_COLUMNS}, ${scoreExpr} as score
      from build_index bi${query.engine ? ' join fam on fam.engine_family = bi.engine_family' : ''}
     where ${where.join('\n       and ')}
     order by ${keyExpr} desc, bi.stage_id desc
     limit ${limit}`;
  }
  const sql = `${fam}
  select f.*, c.name as customer_name from (${inner}) f
    join customer c on c.id = f.customer_id
   order by f.${outerKey} desc, f.stage_id desc`;
  return { sql, params: [...cq.params, ...q.params, ...oq.params], sort, countSql, countParams };
}

export async function searchBuilds(em: EntityManager, actor: Actor, query: BuildSearchQuery): Promise<BuildSearchPage> {
  const { sql, params, sort, countSql, countParams } = searchSql(actor, query);
  const limit = query.limit;
  const [rows, counted] = await Promise.all([
    em.getConnection().execute(sql, params) as Promise<BuildIndexRow[]>,
    em.getConnection().execute(countSql, countParams) as Promise<{ n: number }[]>,
  ]);
  const page = rows.slice(0, limit);
  const last = page[page.length - 1];
  const nextCursor =
    rows.length > limit && last
      ? encodeCursor({ s: sort, k: sort === 'similarity' ? Number(last.score) : sort === 'gain' ? Number(last.gain_peak_power_hp) : last.stage_date, id: last.stage_id })
      : null;
  return { items: page.map((r) => toBuildItem(r, r.parts)), total: Number(counted[0]?.n ?? 0), page: 1, pageSize: limit, nextCursor, sort };
}
