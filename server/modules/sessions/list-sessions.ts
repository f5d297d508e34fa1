/**
 * The session list's read model: one SQL statement for the rows (no entity hydration) with each
 * session's count of live runs, newest first. Shop-wide it walks dyno_session_list_started
 * (Migration20261202171000); for one bike, dyno_session_shop_id_bike_id_started_at_index.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { tenantParams } from '../../http/tenant-scope';
import type { Page } from '@shared/schemas/common';
import type { CorrectionId, SessionDto } from '@shared/schemas/run';
import { boundedTotal } from '../../db/bounded-total';
import { Sql } from '../builds/build-sql';

/** At most this many sessions per answer, newest first (as before). */
export const SESSION_PAGE = 500;

interface SessionListRow {
  id: string;
  bike_id: string;
  started_at: Date | string;
  dyno_id: string | null;
  dyno_name: string | null;
  operator_name: string | null;
  ambient_temp_c: number | null;
  baro_kpa: number | null;
  humidity_pct: number | null;
  correction_standard: string;
  notes: string | null;
  safety_confirmed_at: Date | string | null;
  safety_confirmed_by_name: string | null;
  run_count: number;
}

const iso = (v: Date | string) => (v instanceof Date ? v : new Date(v)).toISOString();

/** FROM … WHERE of the sessions the actor may see (of one bike when asked). */
export function sessionFromWhere(actor: Actor, query: { bikeId?: string }): { sql: string; params: unknown[] } {
  const s = new Sql();
  const { shopId, customerId } = tenantParams(actor);
  const and = [`s.shop_id = ${s.p(shopId)}`];
  if (customerId !== null) and.push(`s.bike_id = any(array(select b.id from bike b where b.shop_id = ${s.p(shopId)} and b.customer_id = ${s.p(customerId)}))`);
  if (query.bikeId) and.push(`s.bike_id = ${s.p(query.bikeId)}`);
  return { sql: `from dyno_session s where ${and.join(' and ')}`, params: s.params };
}

export async function listSessionRows(em: EntityManager, actor: Actor, query: { bikeId?: string }): Promise<Page<SessionDto>> {
  const where = sessionFromWhere(actor, query);
  const sql = `select s.id, s.bike_id, s.started_at, s.dyno_id, d.name as dyno_name, op.name as operator_name, s.ambient_temp_c, s.baro_kpa, s.humidity_pct,
      s.correction_standard, s.notes, s.safety_confirmed_at, sc.name as safety_confirmed_by_name,
      (select count(*)::int from run r where r.shop_id = s.shop_id and r.session_id = s.id and r.deleted_at is null) as run_count
    from (select s.* ${where.sql} order by s.started_at desc, s.id asc limit ${SESSION_PAGE}) s
    left join dyno d on d.id = s.dyno_id
    left join app_user op on op.id = s.operator_id
    left join app_user sc on sc.id = s.safety_confirmed_by_id
   order by s.started_at desc, s.id asc`;
  const rows = (await em.getConnection().execute(sql, where.params)) as SessionListRow[];
  const { total, exact } = await boundedTotal(em, where.sql, where.params, { atLeast: rows.length, orderBy: 's.started_at desc, s.id asc' });
  const items = rows.map((s): SessionDto => ({
    id: s.id,
    bikeId: s.bike_id,
    startedAt: iso(s.started_at),
    dynoId: s.dyno_id,
    dynoName: s.dyno_name,
    operatorName: s.operator_name,
    ambientTempC: s.ambient_temp_c,
    baroKpa: s.baro_kpa,
    humidityPct: s.humidity_pct,
    correctionStandard: s.correction_standard as CorrectionId,
    notes: s.notes,
    safetyConfirmedAt: s.safety_confirmed_at ? iso(s.safety_confirmed_at) : null,
    safetyConfirmedByName: s.safety_confirmed_by_name,
    runCount: s.run_count,
  }));
  return { items, total, ...(exact ? {} : { totalIsEstimate: true }), page: 1, pageSize: SESSION_PAGE, nextCursor: null };
}
