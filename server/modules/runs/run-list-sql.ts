/**
 * The run list's read model: hand-written SQL over `run` (Migration20261202170000), so a page
 * costs its own rows, not the archive. Pure text building (no database here), so tests can
 * EXPLAIN the exact statements the route runs.
 *
 * - Every order has a partial index of live runs that matches it column for column; a page is
 *   the first rows of an index walk. The peak orders put runs without a peak last by sorting
 *   coalesce(peak, ∓Infinity), which is what their indexes hold.
 * - The page's ids come from `run` alone (index walk, keyset or offset); only those rows are then
 *   joined to bike, customer and stage.
 * - Keyset cursors carry the last row's sort value, time and id; the first sort column is a range
 *   condition the index seeks to, the rest break ties.
 * - Search matches run.search_text (file name, label, note, tags, make, model, engine family,
 *   customer, stage; kept by triggers) with ILIKE, which the trigram index serves.
 */
import type { z } from 'zod';
import type { Actor } from '../../http/actor';
import { tenantParams } from '../../http/tenant-scope';
import { containsPattern } from '../../db/sql-text';
import { AppError } from '../../lib/errors';
import { parseSort } from '@shared/schemas/common';
import type { runListQuery } from '@shared/schemas/run';
import { Sql } from '../builds/build-sql';

export type RunListQuery = z.output<typeof runListQuery>;

interface SortSpec {
  /** The first ORDER BY expression (over `r`), as its index holds it. */
  key: string;
  dir: 'asc' | 'desc';
  /** SQL type of the key, to cast the cursor's text back. */
  type: 'timestamptz' | 'float8';
}

export function sortSpec(sort: string | undefined): SortSpec & { name: string } {
  const { field, dir } = parseSort(sort, '-createdAt');
  const name = `${dir === 'desc' ? '-' : ''}${field}`;
  if (field === 'createdAt') return { name, key: 'r.created_at', dir, type: 'timestamptz' };
  const column = field === 'peakPowerHp' ? 'peak_power_hp' : 'peak_torque_lbft';
  // Nulls last in both directions: the emptiest value of the direction stands in for null.
  const blank = dir === 'desc' ? `'-Infinity'::float8` : `'Infinity'::float8`;
  return { name, key: `coalesce(r.${column}, ${blank})`, dir, type: 'float8' };
}

/** ORDER BY of a sort: the key, then newest first, then id (the earlier ORM list's order). */
export function orderBy(spec: SortSpec, alias = 'r'): string {
  const key = alias === 'r' ? spec.key : 'p.sort_key';
  if (spec.type === 'timestamptz') return `${key} ${spec.dir}, ${alias}.id asc`;
  return `${key} ${spec.dir}, ${alias}.created_at desc, ${alias}.id asc`;
}

export interface RunCursor {
  sort: string;
  /** The sort key of the last row, as PostgreSQL printed it. */
  key: string;
  createdAt: string;
  id: string;
}

export function encodeCursor(c: RunCursor): string {
  return Buffer.from(JSON.stringify([c.sort, c.key, c.createdAt, c.id]), 'utf8').toString('base64url');
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
/** A timestamptz as PostgreSQL prints it (ISO style, any zone offset). */
const TIMESTAMP = /^\d{4}-\d{2}-\d{2}[ T]\d{2}:\d{2}:\d{2}(\.\d{1,6})?([+-]\d{2}(:?\d{2})?|Z)?$/;

/** A cursor of this sort, or a 400 (a cursor of another sort or a made-up one means nothing here). */
export function decodeCursor(text: string, sort: string): RunCursor {
  const bad = () => new AppError('VALIDATION_FAILED', 'This page cursor is not valid for the list; start again from the first page', 400, { fields: [{ path: 'cursor', message: 'Not a valid cursor' }] });
  let parts: unknown;
  try {
    parts = JSON.parse(Buffer.from(text, 'base64url').toString('utf8'));
  } catch {
    throw bad();
  }
  if (!Array.isArray(parts) || parts.length !== 4 || !parts.every((p) => typeof p === 'string')) throw bad();
  const [s, key, createdAt, id] = parts as string[];
  if (s !== sort || !UUID.test(id) || !TIMESTAMP.test(createdAt) || (key !== createdAt && !/^-?(Infinity|[0-9.e+-]+)$/i.test(key))) throw bad();
  return { sort: s, key, createdAt, id };
}

/** WHERE of the list over `r` (run): tenant, deleted, filters, search. */
export function whereOf(sql: Sql, actor: Actor, query: RunListQuery): string {
  const { shopId, customerId } = tenantParams(actor);
  const and = [`r.shop_id = ${sql.p(shopId)}`];
  const withDeleted = query.includeDeleted === true && actor.role === 'owner';
  if (!withDeleted) and.push('r.deleted_at is null');
  // A customer's bikes as an array computed once (= ANY of an InitPlan): the planner then reads
  // those bikes' runs from the bike index. Written as IN (subquery) it walks the whole order
  // index testing every run (seconds at 250 000 runs a shop).
  const bikesOf = (customer: string) => `r.bike_id = any(array(select b.id from bike b where b.shop_id = ${sql.p(shopId)} and b.customer_id = ${sql.p(customer)}))`;
  if (customerId !== null) and.push(bikesOf(customerId));
  if (query.bikeId) and.push(`r.bike_id = ${sql.p(query.bikeId)}`);
  if (query.customerId) and.push(bikesOf(query.customerId));
  if (query.stageId) and.push(`r.stage_id = ${sql.p(query.stageId)}`);
  if (query.sessionId) and.push(`r.session_id = ${sql.p(query.sessionId)}`);
  if (query.status) and.push(`r.status = ${sql.p(query.status)}`);
  if (query.tag) and.push(`r.tags @> array[${sql.p(query.tag)}]::text[]`);
  if (query.from) and.push(`r.created_at >= ${sql.p(`${query.from}T00:00:00Z`)}::timestamptz`);
  if (query.to) and.push(`r.created_at < ${sql.p(`${query.to}T00:00:00Z`)}::timestamptz + interval '1 day'`);
  if (query.q) and.push(`r.search_text ilike ${sql.p(containsPattern(query.q))}`);
  return and.join(' and ');
}

/** Rows after the cursor in the sort's order: a range on the first key (seekable), ties after. */
function afterCursor(sql: Sql, spec: SortSpec, c: RunCursor): string {
  const op = spec.dir === 'desc' ? '<' : '>';
  const key = `${sql.p(c.key)}::${spec.type}`;
  if (spec.type === 'timestamptz') {
    const again = `${sql.p(c.key)}::timestamptz`;
    return `${spec.key} ${op}= ${key} and (${spec.key} ${op} ${again} or r.id > ${sql.p(c.id)})`;
  }
  const again = `${sql.p(c.key)}::float8`;
  const at = `${sql.p(c.createdAt)}::timestamptz`;
  const at2 = `${sql.p(c.createdAt)}::timestamptz`;
  return `${spec.key} ${op}= ${key} and (${spec.key} ${op} ${again} or r.created_at < ${at} or (r.created_at = ${at2} and r.id > ${sql.p(c.id)}))`;
}

/** Columns of a list row (RunListRow). */
const ROW_COLUMNS = `r.id, r.bike_id, b.make, b.model, b.year, c.name as customer_name, r.session_id, r.stage_id, st.name as stage_name,
  r.label, r.sequence, r.original_name, r.status, r.peak_power_hp, r.peak_power_rpm, r.peak_torque_lbft, r.peak_torque_rpm,
  r.rpm_min, r.rpm_max, r.identity_status, r.correction_standard, r.correction_factor, r.warnings,
  r.error->>'code' as error_code, r.error->>'message' as error_message, r.tags, r.note,
  exists (select 1 from stage rs where rs.reference_run_id = r.id) as is_reference,
  r.pull_index, r.pull_count, r.created_at, r.deleted_at, p.sort_key, p.created_at_text`;

/**
 * The page: `pageSize + 1` ids walked from `run` (the extra one tells whether more follow), then
 * those rows with their bike, customer and stage. Keyset when a cursor is given, else offset.
 *
 * An offset page that ends within the first `countUpTo` matches walks that many ids once, in a
 * materialized CTE, and answers `matched` (how many of them there were) on every row: the page
 * and its bounded count from one walk of the index (or one trigram bitmap) instead of two.
 */
export function pageSql(
  actor: Actor,
  query: RunListQuery & { cursor?: string },
  countUpTo = 0,
): { sql: string; params: unknown[]; spec: SortSpec & { name: string }; counts: boolean } {
  const spec = sortSpec(query.sort);
  const s = new Sql();
  const conds = [whereOf(s, actor, query)];
  if (query.cursor) conds.push(afterCursor(s, spec, decodeCursor(query.cursor, spec.name)));
  const offset = query.cursor ? 0 : (query.page - 1) * query.pageSize;
  const counts = !query.cursor && offset + query.pageSize + 1 <= countUpTo;
  const walked = `select r.id, r.created_at, ${spec.key}::text as sort_key, r.created_at::text as created_at_text, ${spec.key} as sort_value
      from run r where ${conds.join(' and ')}
     order by ${orderBy(spec)}`;
  const order = spec.type === 'timestamptz' ? `p.sort_value ${spec.dir}, p.id asc` : `p.sort_value ${spec.dir}, p.created_at desc, p.id asc`;
  // Placeholders are positional: bind in the order they appear in the text (head, then inner).
  const head = counts ? `with m as materialized (${walked} limit ${s.p(countUpTo)}) ` : '';
  const inner = counts
    ? `select m.* from m order by ${order.replaceAll('p.', 'm.')} limit ${s.p(query.pageSize + 1)} offset ${s.p(offset)}`
    : `${walked} limit ${s.p(query.pageSize + 1)} offset ${s.p(offset)}`;
  const sql = `${head}select ${ROW_COLUMNS}${counts ? ', (select count(*) from m)::int as matched' : ''}
      from (${inner}) p
      join run r on r.id = p.id
      join bike b on b.id = r.bike_id
      join customer c on c.id = b.customer_id
      left join stage st on st.id = r.stage_id
     order by ${order}`;
  return { sql, params: s.params, spec, counts };
}

/** FROM … WHERE of every run the list matches (for boundedTotal; the cursor does not narrow it). */
export function totalFromWhere(actor: Actor, query: RunListQuery): { sql: string; params: unknown[] } {
  const s = new Sql();
  return { sql: `from run r where ${whereOf(s, actor, query)}`, params: s.params };
}

/** A row of pageSql. */
export interface RunListRow {
  id: string;
  bike_id: string;
  make: string;
  model: string;
  year: number | null;
  customer_name: string;
  session_id: string | null;
  stage_id: string | null;
  stage_name: string | null;
  label: string | null;
  sequence: number;
  original_name: string;
  status: string;
  peak_power_hp: number | null;
  peak_power_rpm: number | null;
  peak_torque_lbft: number | null;
  peak_torque_rpm: number | null;
  rpm_min: number | null;
  rpm_max: number | null;
  identity_status: string | null;
  correction_standard: string | null;
  correction_factor: number | null;
  warnings: { code: string; message: string }[] | null;
  error_code: string | null;
  error_message: string | null;
  tags: string[] | null;
  note: string | null;
  is_reference: boolean;
  pull_index: number;
  pull_count: number;
  created_at: Date | string;
  deleted_at: Date | string | null;
  sort_key: string;
  created_at_text: string;
  /** With pageSql's `countUpTo`: how many matches the walk found, at most `countUpTo`. */
  matched?: number;
}
