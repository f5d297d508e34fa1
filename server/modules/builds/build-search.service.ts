import type { EntityManager } from '@mikro-orm/postgresql';
import { HEAD_WORK_LEVELS } from '@shared/parts';
import { CC_PER_CUBIC_INCH } from '@shared/displacement';
import type { Actor } from '../../http/actor';
import { AppError } from '../../lib/errors';
import type { BuildSearchQuery } from './build.schemas';
import type { BuildSearchPage } from '@shared/schemas/builds';
import { BUILD_COLUMNS, FTS, Sql, cumulativeParts, escapeLike, toBuildItem, type BuildRow } from './build-sql';

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
 * - q: PostgreSQL full-text (websearch syntax, 'english' configuration) over the stage's name and
 *   description, the notes of the stage's runs, and the part descriptions of the cumulative build.
 * - tag: the stage has a (not deleted) run carrying every listed tag.
 * - from/to: stage date (or the day the stage was recorded when it has no date), inclusive.
 * - customerId: bikes of that customer.
 * Everything is scoped to the caller's shop.
 *
 * Sorting is always descending with the stage id as tie-breaker, and paging is keyset: the
 * cursor carries the last row's sort key and id.
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

/** The search statement and its parameters (also used by the EXPLAIN test). */
export function searchSql(actor: Actor, query: BuildSearchQuery): { sql: string; params: unknown[]; sort: Sort } {
  const sort: Sort = query.sort ?? (query.engine ? 'similarity' : 'gain');
  // Placeholders are positional: each part of the statement collects its own values, joined in text order.
  const q = new Sql(); // WHERE of the found CTE
  const cq = new Sql(); // the text CTEs
  const sq = new Sql(); // the select list (score)
  const oq = new Sql(); // cursor and limit
  const shop = actor.shopId;
  const where: string[] = [`s.shop_id = ${q.p(shop)}`, `b.shop_id = ${q.p(shop)}`, `s.gain_peak_power_hp is not null`];
  const ctes: string[] = [];

  const scoreExpr = query.engine ? `coalesce(word_similarity(${sq.p(query.engine)}, b.engine_family), 0)::float8` : `0::float8`;

  if (query.engine) {
    where.push(`(${q.p(query.engine)} <% b.engine_family or b.engine_family ilike ${q.p(`%${escapeLike(query.engine)}%`)})`);
  }
  if (query.make) where.push(`b.make ilike ${q.p(`%${escapeLike(query.make)}%`)}`);
  if (query.model) where.push(`b.model ilike ${q.p(`%${escapeLike(query.model)}%`)}`);

  const mins = [query.ccMin, query.ciMin !== undefined ? query.ciMin * CC_PER_CUBIC_INCH : undefined].filter((v): v is number => v !== undefined);
  const maxs = [query.ccMax, query.ciMax !== undefined ? query.ciMax * CC_PER_CUBIC_INCH : undefined].filter((v): v is number => v !== undefined);
  if (mins.length) where.push(`b.displacement_cc >= ${q.p(Math.max(...mins))}`);
  if (maxs.length) where.push(`b.displacement_cc <= ${q.p(Math.min(...maxs))}`);
  if (query.cylinders !== undefined) where.push(`b.cylinders = ${q.p(query.cylinders)}`);
  if (query.customerId) where.push(`b.customer_id = ${q.p(query.customerId)}`);
  if (query.from) where.push(`coalesce(s.date, s.created_at::date) >= ${q.p(query.from)}::date`);
  if (query.to) where.push(`coalesce(s.date, s.created_at::date) <= ${q.p(query.to)}::date`);

  const categories = new Set(query.parts);
  if (query.headLevel) categories.add('cylinder-heads');
  for (const category of categories) {
    const categoryPh = q.p(category);
    let extra = '';
    if (category === 'cylinder-heads' && query.headLevel) {
      const levels = HEAD_WORK_LEVELS.slice(HEAD_WORK_LEVELS.indexOf(query.headLevel));
      extra = ` and p.head_work_level in (${q.list(levels)})`;
    }
    where.push(`exists (select 1 from stage ps join part p on p.stage_id = ps.id
                         where ps.bike_id = s.bike_id and ps.position <= s.position and p.category = ${categoryPh}${extra})`);
  }
  if (query.partText) {
    where.push(`exists (select 1 from stage ps join part p on p.stage_id = ps.id
                         where ps.bike_id = s.bike_id and ps.position <= s.position and p.description ilike ${q.p(`%${escapeLike(query.partText)}%`)})`);
  }
  for (const tag of query.tag) {
    where.push(`s.id in (select r.stage_id from run r where r.shop_id = ${q.p(shop)} and r.deleted_at is null and r.tags @> array[${q.p(tag)}]::text[])`);
  }
  if (query.q) {
    // Materialized so each text match is one index scan over its table, not a per-row recheck.
    // websearch_to_tsquery(regconfig, text) is immutable, so each copy folds to a constant the indexes can use.
    const tsq = () => `websearch_to_tsquery('english', ${cq.p(query.q)})`;
    ctes.push(`text_stage as materialized (
        select ts.id as stage_id from stage ts where ts.shop_id = ${cq.p(shop)} and ${FTS.stage('ts')} @@ ${tsq()}
        union
        select r.stage_id from run r where r.shop_id = ${cq.p(shop)} and r.deleted_at is null and r.stage_id is not null and ${FTS.run('r')} @@ ${tsq()})`);
    ctes.push(`text_part as materialized (
        select ps.bike_id, min(ps.position) as position from part p join stage ps on ps.id = p.stage_id
         where p.shop_id = ${cq.p(shop)} and ${FTS.part('p')} @@ ${tsq()} group by ps.bike_id)`);
    where.push(`(s.id in (select stage_id from text_stage) or exists (select 1 from text_part tp where tp.bike_id = s.bike_id and tp.position <= s.position))`);
  }

  const keyExpr = sort === 'similarity' ? 'score' : sort === 'gain' ? 'gain_peak_power_hp' : 'stage_date';
  const outer: string[] = [];
  if (query.cursor) {
    const c = decodeCursor(query.cursor, sort);
    const cast = sort === 'date' ? '::text' : '::float8';
    outer.push(`(${keyExpr}, stage_id) < (${oq.p(c.k)}${cast}, ${oq.p(c.id)}::uuid)`);
  }
  const limit = query.limit;
  const sql = `with ${[...ctes, `found as (
      select ${BUILD_COLUMNS}, ${scoreExpr} as score
        from stage s join bike b on b.id = s.bike_id join customer c on c.id = b.customer_id
       where ${where.join('\n         and ')})`].join(',\n')}
    select * from found ${outer.length ? `where ${outer.join(' and ')}` : ''}
     order by ${keyExpr} desc, stage_id desc
     limit ${oq.p(limit + 1)}`;
  return { sql, params: [...cq.params, ...sq.params, ...q.params, ...oq.params], sort };
}

export async function searchBuilds(em: EntityManager, actor: Actor, query: BuildSearchQuery): Promise<BuildSearchPage> {
  const { sql, params, sort } = searchSql(actor, query);
  const limit = query.limit;
  const shop = actor.shopId;
  const rows = (await em.getConnection().execute(sql, params)) as BuildRow[];
  const page = rows.slice(0, limit);
  const parts = await cumulativeParts(em, shop, page.map((r) => r.stage_id));
  const last = page[page.length - 1];
  const next =
    rows.length > limit && last
      ? encodeCursor({ s: sort, k: sort === 'similarity' ? Number(last.score) : sort === 'gain' ? Number(last.gain_peak_power_hp) : last.stage_date, id: last.stage_id })
      : null;
  return { items: page.map((r) => toBuildItem(r, parts.get(r.stage_id) ?? [])), next, sort };
}
