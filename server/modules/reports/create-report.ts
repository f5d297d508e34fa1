/**
 * Use case: generate a gain report version from a saved comparison — the comparison evaluated once,
 * rendered to PDF, stored immutably in object storage, and recorded with its audit entry in one
 * transaction (a stored PDF whose row does not commit is discarded).
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import type { AppDeps } from '../../app-deps';
import { AppError, notFound } from '../../lib/errors';
import { discardObject } from '../../lib/storage/discard-object';
import type { ReportCreated, ReportInput } from '@shared/schemas/report';
import { Comparison } from '../comparisons/comparison.entity';
import { type EvaluateComparison, evaluateComparison } from '../comparisons/evaluate-comparison';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';
import { recordAudit } from '../audit/audit.service';
import { Report } from './report.entity';
import { buildReportData } from './report-content';
import { renderReportPdf } from './pdf/render';
import { sha256 } from './report-access';

/** Report number for a new report: "R-<year>-<4-digit sequence>" per shop and year. */
async function nextNumber(em: EntityManager, shopId: string, year: number): Promise<string> {
  const rows = (await em.getConnection().execute(`select count(distinct number)::int as n from report where shop_id = ? and number like ?`, [shopId, `R-${year}-%`])) as { n: number }[];
  return `R-${year}-${String((rows[0]?.n ?? 0) + 1).padStart(4, '0')}`;
}

/** `evaluate` is the comparison use case, a parameter so a test can check it runs once per report. */
export async function createReport(deps: AppDeps, em: EntityManager, actor: Actor, input: ReportInput, evaluate: EvaluateComparison = evaluateComparison): Promise<ReportCreated> {
  const comparison = await em.findOne(Comparison, { id: input.comparisonId, shop: actor.shopId });
  if (!comparison) throw notFound('Comparison');
  let storedKey: string | null = null; // set once the PDF is in storage
  return em
    .transactional(async (tx) => {
      // One report number at a time per shop, so numbers and versions never collide.
      await tx.getConnection().execute('select pg_advisory_xact_lock(hashtext(?))', [`report-number:${actor.shopId}`], 'all', tx.getTransactionContext());
      const previous = await tx.findOne(Report, { shop: actor.shopId, comparison: comparison.id }, { orderBy: { version: 'desc' } });
      const createdAt = new Date();
      const number = previous?.number ?? (await nextNumber(tx, actor.shopId, createdAt.getUTCFullYear()));
      const version = (previous?.version ?? 0) + 1;
      const technicianNote = input.technicianNote === undefined ? (previous?.technicianNote ?? null) : input.technicianNote;
      // One evaluation: the same content is printed in the PDF and stored as the version's summary.
      const { data, shop, bike } = await buildReportData(tx, actor, comparison.id, { number, version, createdAt, technicianNote }, evaluate);
      const logo = shop.logoKey ? await deps.storage.getBuffer(shop.logoKey).catch(() => null) : null;
      const pdf = await renderReportPdf(data, logo);
      const key = `shops/${actor.shopId}/reports/${number}/v${version}.pdf`;
      // Stored versions are never overwritten.
      if (await deps.storage.exists(key)) throw new AppError('REPORT_VERSION_EXISTS', 'This report version is already stored; try again', 409);
      const hash = sha256(pdf);
      await deps.storage.put(key, pdf, { contentType: 'application/pdf', metadata: { sha256: hash } });
      storedKey = key;
      const report = tx.create(Report, {
        shop: tx.getReference(Shop, actor.shopId),
        bike,
        comparison,
        number,
        version,
        pdfKey: key,
        pdfSha256: hash,
        pdfSizeBytes: pdf.length,
        technicianNote,
        summary: data as unknown as Record<string, unknown>,
        createdBy: tx.getReference(User, actor.id),
        createdAt,
      } as Report);
      await tx.flush();
      await recordAudit(tx, actor, 'report.create', 'report', report.id, { number, version, comparisonId: comparison.id });
      return { id: report.id, number, version, pdfUrl: `/api/reports/${report.id}/pdf`, pdfSha256: hash };
    })
    .catch(async (err: unknown) => {
      // The row did not commit after the PDF was stored: remove the object (or record it for the start-up pass).
      if (storedKey) {
        const why = (err instanceof Error ? err.message : String(err)).split(' - ').pop()!.slice(0, 300);
        await discardObject(deps, storedKey, `report row for ${storedKey} did not commit: ${why}`);
      }
      throw err;
    });
}
