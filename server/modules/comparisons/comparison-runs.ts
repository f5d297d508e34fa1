/**
 * What a comparison reads of its runs: a plain read model (no managed entities, no change-tracking
 * snapshots of the curve columns), filled by prepared SQL statements (server/db/prepared-query.ts), with the parsed curves kept
 * in a small in-process cache keyed by run id and the row's `updated_at`.
 *
 * The preview endpoint is the hottest read in the product (the builder asks again on every
 * option change), and a run's curve is by far its largest column, so a repeat preview reads only
 * the small columns and takes the curves from the cache.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { tenantParams } from '../../http/tenant-scope';
import type { StoredCurve } from '../runs/run.entity';
import { preparedQuery as query, type PreparedStatement } from '../../db/prepared-query';
import { MAX_STAGE_RUNS, type EngineRun } from './engine/types';

export { MAX_STAGE_RUNS } from './engine/types';
/** A run as a comparison reads it: the engine's plain input. */
export type RunRow = EngineRun;

interface RunRecord {
  id: string;
  /** `updated_at` as PostgreSQL prints it (microseconds kept): the curve cache's version tag. */
  version: string;
  label: string | null;
  sequence: number;
  original_name: string;
  pull_index: number;
  pull_count: number;
  status: string;
  has_curve: boolean;
  correction_standard: string | null;
  correction_factor: number | null;
  conditions: unknown;
  identity_status: string | null;
  warnings: unknown;
  created_at: string | Date;
  stage_id: string | null;
  bike_id: string;
  bike_make: string;
  bike_model: string;
  bike_year: number | null;
  stage_name: string | null;
  stage_position: number | null;
  session_id: string | null;
  session_started_at: string | Date | null;
  session_ambient_temp_c: number | null;
  session_baro_kpa: number | null;
  session_humidity_pct: number | null;
  dyno_id: string | null;
  dyno_name: string | null;
}

// The ORM's pg connections return timestamps (and, on some paths, json) as text.
const toDate = (v: string | Date) => (v instanceof Date ? v : new Date(v));
const jsonOf = <T>(v: unknown): T => (typeof v === 'string' ? (JSON.parse(v) as T) : (v as T));

/**
 * Every run of the shop ($1) not deleted — for customers only their bikes' ($4) — that is one of
 * $2, or a ready run of one of the stages $3; `wide` adds every run of the bikes of $2 and the
 * ready runs of the stages of $2. One fixed text per variant, so each variant keeps a plan of its
 * own (a generic plan of one text for all four could not drop the conditions a variant lacks).
 */
function runRowsStatement(variant: { customer: boolean; wide: boolean }): PreparedStatement {
  const { customer, wide } = variant;
  const which = ['r.id = any($2::uuid[])', `(r.status = 'ready' and r.stage_id = any($3::uuid[]))`];
  if (wide) {
    which.push('r.bike_id in (select w.bike_id from wanted w)', `(r.status = 'ready' and r.stage_id in (select w.stage_id from wanted w))`);
  }
  return {
    name: `pullbook-comparison-runs-${customer ? 'customer' : 'staff'}-${wide ? 'wide' : 'narrow'}`,
    text: `${wide ? 'with wanted as (select x.bike_id, x.stage_id from run x where x.shop_id = $1 and x.deleted_at is null and x.id = any($2::uuid[]))' : ''}
    select r.id, r.updated_at::text as version, r.label, r.sequence, r.original_name, r.pull_index, r.pull_count, r.status, r.curve is not null as has_curve,
           r.correction_standard, r.correction_factor, r.conditions, r.identity_status, r.warnings, r.created_at, r.stage_id,
           b.id as bike_id, b.make as bike_make, b.model as bike_model, b.year as bike_year,
           st.name as stage_name, st.position as stage_position,
           ds.id as session_id, ds.started_at as session_started_at, ds.ambient_temp_c as session_ambient_temp_c, ds.baro_kpa as session_baro_kpa, ds.humidity_pct as session_humidity_pct,
           d.id as dyno_id, d.name as dyno_name
      from run r
      join bike b on b.id = r.bike_id
      left join stage st on st.id = r.stage_id
      left join dyno_session ds on ds.id = r.session_id
      left join dyno d on d.id = ds.dyno_id
     where r.shop_id = $1 and r.deleted_at is null${customer ? ' and b.customer_id = $4::uuid' : ''}
       and (${which.join(' or ')})
     order by r.created_at desc, r.id`,
  };
}
const RUN_ROWS = {
  staff: { narrow: runRowsStatement({ customer: false, wide: false }), wide: runRowsStatement({ customer: false, wide: true }) },
  customer: { narrow: runRowsStatement({ customer: true, wide: false }), wide: runRowsStatement({ customer: true, wide: true }) },
};
// Scoped to the shop as well, though the ids come from the scoped rows query.
const CURVES = { name: 'pullbook-comparison-curves', text: 'select id, updated_at::text as version, curve from run where shop_id = $1 and id = any($2::uuid[])' };

function deepFreeze(value: object) {
  for (const v of Object.values(value)) if (v && typeof v === 'object' && !Object.isFrozen(v)) deepFreeze(v as object);
  Object.freeze(value);
}

/** Parsed curves by run id with the `updated_at` they were read at; least recently used first out. */
class CurveCache {
  private readonly entries = new Map<string, { version: string; curve: StoredCurve | null }>();
  constructor(private readonly maxEntries: number) {}

  get(id: string, version: string): StoredCurve | null | undefined {
    const hit = this.entries.get(id);
    if (!hit || hit.version !== version) return undefined;
    this.entries.delete(id);
    this.entries.set(id, hit);
    return hit.curve;
  }

  /** Frozen, as one cached curve is shared by every request that reads it. */
  set(id: string, version: string, curve: StoredCurve | null) {
    if (curve) deepFreeze(curve);
    this.entries.delete(id);
    this.entries.set(id, { version, curve });
    if (this.entries.size > this.maxEntries) this.entries.delete(this.entries.keys().next().value!);
  }
}

/** About 2,000 curves of a few kB each: the runs a busy shop compares over a day. */
const curveCache = new CurveCache(2000);

function toRunRow(r: RunRecord, curve: StoredCurve | null): RunRow {
  return {
    id: r.id,
    label: r.label,
    sequence: r.sequence,
    status: r.status,
    curve,
    correctionStandard: r.correction_standard,
    correctionFactor: r.correction_factor,
    conditions: jsonOf<Record<string, unknown> | null>(r.conditions),
    identityStatus: r.identity_status,
    warnings: jsonOf<{ code: string; message?: string }[] | null>(r.warnings) ?? [],
    createdAt: toDate(r.created_at),
    bike: { id: r.bike_id, make: r.bike_make, model: r.bike_model, year: r.bike_year },
    file: { originalName: r.original_name, pullIndex: r.pull_index, pullCount: r.pull_count },
    stage: r.stage_id ? { id: r.stage_id, name: r.stage_name ?? '', position: r.stage_position ?? 0 } : null,
    session: r.session_id
      ? {
          id: r.session_id,
          startedAt: toDate(r.session_started_at!),
          ambientTempC: r.session_ambient_temp_c,
          baroKpa: r.session_baro_kpa,
          humidityPct: r.session_humidity_pct,
          dyno: r.dyno_id ? { id: r.dyno_id, name: r.dyno_name ?? '' } : null,
        }
      : null,
  };
}

/**
 * Reads the rows, then the curves that are needed and not cached (one more query, skipped when
 * every needed curve is cached). Needed: the runs `ids`, and the newest {@link MAX_STAGE_RUNS}
 * ready runs of each stage in `stageIds` and (with `wide`) of the stages of `ids`.
 */
async function loadRows(em: EntityManager, actor: Actor, ids: string[], stageIds: string[], wide: boolean): Promise<RunRow[]> {
  const scope = tenantParams(actor);
  const values: unknown[] = [scope.shopId, ids, stageIds];
  const audience = scope.customerId === null ? 'staff' : 'customer';
  if (scope.customerId !== null) values.push(scope.customerId);
  const records = await query<RunRecord>(em, RUN_ROWS[audience][wide ? 'wide' : 'narrow'], values);
  // Rows read inside a transaction may never be committed: they neither fill nor use the cache.
  const cache = em.isInTransaction() ? null : curveCache;

  const wanted = new Set(ids);
  const spreadStages = new Set(stageIds);
  if (wide) for (const r of records) if (wanted.has(r.id) && r.stage_id) spreadStages.add(r.stage_id);
  const perStage = new Map<string, number>();
  for (const r of records) {
    if (r.status !== 'ready' || !r.has_curve || !r.stage_id || !spreadStages.has(r.stage_id)) continue;
    const n = perStage.get(r.stage_id) ?? 0;
    if (n < MAX_STAGE_RUNS) wanted.add(r.id);
    perStage.set(r.stage_id, n + 1);
  }

  const curves = new Map<string, StoredCurve | null>();
  const missing: string[] = [];
  for (const r of records) {
    if (!wanted.has(r.id)) continue;
    if (!r.has_curve) curves.set(r.id, null);
    else {
      const cached = cache?.get(r.id, r.version);
      if (cached === undefined) missing.push(r.id);
      else curves.set(r.id, cached);
    }
  }
  if (missing.length) {
    for (const c of await query<{ id: string; version: string; curve: unknown }>(em, CURVES, [scope.shopId, missing])) {
      const curve = jsonOf<StoredCurve | null>(c.curve);
      cache?.set(c.id, c.version, curve);
      curves.set(c.id, curve);
    }
  }
  return records.map((r) => toRunRow(r, curves.get(r.id) ?? null));
}

/**
 * Everything a preview reads: every visible run of the compared runs' bikes (their archive, for
 * the colour slots) and every ready run of the compared runs' stages (for the spread), newest
 * first. Curves are attached to the compared runs and to the stage runs the spread uses.
 */
export function loadPreviewRows(em: EntityManager, actor: Actor, ids: string[]): Promise<RunRow[]> {
  return loadRows(em, actor, ids, [], true);
}

/**
 * Runs visible to the actor that are one of `ids` or a ready run of one of `stageIds`, newest
 * first, with curves for those and for the stage runs the spread uses.
 */
export function loadRunRows(em: EntityManager, actor: Actor, ids: string[], stageIds: string[]): Promise<RunRow[]> {
  return loadRows(em, actor, ids, stageIds, false);
}
