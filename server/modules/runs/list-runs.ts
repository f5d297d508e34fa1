/** The run list: filters, search, sort and page over the runs the actor may see (SQL read model: run-list-sql.ts). */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import type { ApiErrorCode } from '@shared/errors';
import { bikeLabel } from '@shared/labels';
import type { Page } from '@shared/schemas/common';
import type { CorrectionId, RunStatusId, RunSummaryDto } from '@shared/schemas/run';
import { boundedTotal, estimatedTotal, EXACT_TOTAL_LIMIT, wholeListOnFirstPage } from '../../db/bounded-total';
import { encodeCursor, orderBy, pageSql, totalFromWhere, type RunListQuery, type RunListRow } from './run-list-sql';

export type { RunListQuery } from './run-list-sql';

const iso = (v: Date | string) => (v instanceof Date ? v : new Date(v)).toISOString();

export function toRunListItem(r: RunListRow): RunSummaryDto {
  const warnings = r.warnings ?? [];
  return {
    id: r.id,
    bikeId: r.bike_id,
    bikeLabel: bikeLabel(r),
    customerName: r.customer_name ?? '',
    sessionId: r.session_id,
    stageId: r.stage_id,
    stageName: r.stage_name,
    label: r.label,
    sequence: r.sequence,
    originalName: r.original_name,
    status: r.status as RunStatusId,
    peakPowerHp: r.peak_power_hp,
    peakPowerRpm: r.peak_power_rpm,
    peakTorqueLbft: r.peak_torque_lbft,
    peakTorqueRpm: r.peak_torque_rpm,
    rpmMin: r.rpm_min,
    rpmMax: r.rpm_max,
    identityStatus: r.identity_status as RunSummaryDto['identityStatus'],
    correctionStandard: r.correction_standard as CorrectionId | null,
    correctionFactor: r.correction_factor,
    warnings,
    error: r.error_code ? { code: r.error_code as ApiErrorCode, message: r.error_message ?? '' } : null,
    tags: r.tags ?? [],
    note: r.note,
    isReference: r.is_reference,
    pullIndex: r.pull_index,
    pullCount: r.pull_count,
    review: warnings.some((w) => w.code === 'GLITCHES_REVIEW'),
    createdAt: iso(r.created_at),
    deletedAt: r.deleted_at ? iso(r.deleted_at) : null,
  };
}

/**
 * One page of runs. `cursor` (from the previous page's `nextCursor`) pages by keyset; without it
 * `page` pages by offset. Deleted runs are listed only for an owner who asks (`includeDeleted=true`).
 */
export async function listRuns(em: EntityManager, actor: Actor, query: RunListQuery & { cursor?: string }): Promise<Page<RunSummaryDto>> {
  // First pages walk up to one largest page + 1 matches once, for the rows and the bounded count together.
  const { sql, params, spec, counts } = pageSql(actor, query, EXACT_TOTAL_LIMIT + 1);
  const rows = (await em.getConnection().execute(sql, params)) as RunListRow[];
  const more = rows.length > query.pageSize;
  const shown = rows.slice(0, query.pageSize);
  const last = shown[shown.length - 1];
  const nextCursor = more && last ? encodeCursor({ sort: spec.name, key: last.sort_key, createdAt: last.created_at_text, id: last.id }) : null;
  const page = query.cursor ? 1 : query.page;
  const before = query.cursor ? 0 : (query.page - 1) * query.pageSize;
  const matched = counts && rows.length ? Number(rows[0].matched) : null;
  const { total, exact } = await totalOf(em, actor, query, spec, { before, shown: shown.length, more, matched });
  return { items: shown.map(toRunListItem), total, ...(exact ? {} : { totalIsEstimate: true }), page, pageSize: query.pageSize, nextCursor };
}

/**
 * The list's total, exact up to 200 matches, else the planner's estimate (flagged). From the page
 * itself when it can tell (a short first page, or the `matched` its walk counted), else a bounded
 * walk of the page's own index.
 */
async function totalOf(
  em: EntityManager,
  actor: Actor,
  query: RunListQuery & { cursor?: string },
  spec: ReturnType<typeof pageSql>['spec'],
  page: { before: number; shown: number; more: boolean; matched: number | null },
): Promise<{ total: number; exact: boolean }> {
  const whole = query.cursor ? null : wholeListOnFirstPage(page.before, page.shown, query.pageSize, page.more);
  if (whole) return whole;
  if (page.matched !== null && page.matched <= EXACT_TOTAL_LIMIT) return { total: page.matched, exact: true };
  const all = totalFromWhere(actor, query);
  const atLeast = page.before + page.shown + (page.more ? 1 : 0);
  if (page.matched !== null) return estimatedTotal(em, all.sql, all.params, Math.max(page.matched, atLeast));
  return boundedTotal(em, all.sql, all.params, { orderBy: orderBy(spec), atLeast });
}
