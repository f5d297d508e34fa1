/**
 * The report list's read model: one SQL statement for the rows (no entity hydration), reading
 * from each report's stored summary only the comparison's name, the last gain (the headline) and
 * the units. Newest first; index report_list_created (Migration20261202171000).
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { tenantParams } from '../../http/tenant-scope';
import type { ReportSummary, ReportUnits } from '@shared/schemas/report';
import { Sql } from '../builds/build-sql';
import { bikeLabel } from './report-access';
import type { ReportGain } from './report-data';
import { fmtPctChange, fmtPowerGain } from './figures';

/** At most this many reports per answer (as before). */
export const REPORT_LIST_LIMIT = 500;

interface ReportListRow {
  id: string;
  number: string;
  version: number;
  bike_id: string;
  make: string;
  model: string;
  year: number | null;
  comparison_id: string;
  comparison_name: string | null;
  head_gain: ReportGain | null;
  units: ReportUnits | null;
  created_at: Date | string;
  created_by_name: string | null;
  technician_note: string | null;
  pdf_sha256: string;
  pdf_size_bytes: number;
}

export function reportListSql(actor: Actor, query: { bikeId?: string; comparisonId?: string }): { sql: string; params: unknown[] } {
  const s = new Sql();
  const { shopId, customerId } = tenantParams(actor);
  const and = [`r.shop_id = ${s.p(shopId)}`];
  if (customerId !== null) and.push(`b.customer_id = ${s.p(customerId)}`);
  if (query.bikeId) and.push(`r.bike_id = ${s.p(query.bikeId)}`);
  if (query.comparisonId) and.push(`r.comparison_id = ${s.p(query.comparisonId)}`);
  const sql = `select r.id, r.number, r.version, r.bike_id, b.make, b.model, b.year, r.comparison_id,
      r.summary->'comparison'->>'name' as comparison_name, r.summary->'gains'->-1 as head_gain, r.summary->'units' as units,
      r.created_at, u.name as created_by_name, r.technician_note, r.pdf_sha256, r.pdf_size_bytes
    from report r join bike b on b.id = r.bike_id left join app_user u on u.id = r.created_by_id
   where ${and.join(' and ')}
   order by r.created_at desc, r.version desc
   limit ${s.p(REPORT_LIST_LIMIT)}`;
  return { sql, params: s.params };
}

export async function listReports(em: EntityManager, actor: Actor, query: { bikeId?: string; comparisonId?: string }): Promise<ReportSummary[]> {
  const { sql, params } = reportListSql(actor, query);
  const rows = (await em.getConnection().execute(sql, params)) as ReportListRow[];
  return rows.map((r) => ({
    id: r.id,
    number: r.number,
    version: r.version,
    bikeId: r.bike_id,
    bikeLabel: r.make ? bikeLabel(r) : '',
    comparisonId: r.comparison_id,
    comparisonName: r.comparison_name ?? '',
    createdAt: (r.created_at instanceof Date ? r.created_at : new Date(r.created_at)).toISOString(),
    createdByName: r.created_by_name,
    technicianNote: r.technician_note,
    pdfUrl: `/api/reports/${r.id}/pdf`,
    pdfSha256: r.pdf_sha256,
    pdfSizeBytes: r.pdf_size_bytes,
    headline: r.head_gain ? { peakPowerGain: fmtPowerGain(r.head_gain.peakPowerGain.hp, r.units as ReportUnits), areaGain: fmtPctChange(r.head_gain.areaGainPct) } : null,
  }));
}
