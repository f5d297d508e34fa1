/**
 * Gain reports: generated from a saved comparison (its figures come from the comparisons service,
 * so the PDF prints exactly what the comparison API answers), rendered to PDF, stored immutably
 * and versioned in object storage, e-mailed, and shared by token links.
 */
import { createHash, randomBytes } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { FilterQuery } from '@mikro-orm/core';
import type { Actor } from '../../http/actor';
import type { AppDeps } from '../../app-deps';
import { AppError, notFound } from '../../lib/errors';
import { hitRateLimit } from '../../lib/rate-limit';
import { CORRECTION_STANDARDS } from '@shared/analysis';
import type { ComparisonOptions, ComparisonPreview } from '@shared/schemas/comparison';
import { evaluateComparison, getComparison } from '../comparisons/comparison.service';
import { Comparison } from '../comparisons/comparison.entity';
import { Bike } from '../bikes/bike.entity';
import { Shop } from '../shops/shop.entity';
import { Stage, Part } from '../stages/stage.entity';
import { Dyno } from '../dynos/dyno.entity';
import { User } from '../users/user.entity';
import { recordAudit } from '../audit/audit.service';
import { discardObject } from '../../lib/storage/discard-object';
import { costBetweenStages, stageCostCents } from '../comparisons/stage-cost';
import { Report, ReportDelivery, ShareLink } from './report.entity';
import type { ReportData, ReportStage } from './report-data';
import { DEFAULT_SHARE_DAYS, type ReportSummary } from '@shared/schemas/report';
import { renderReportPdf } from './pdf/render';
import { fmtPctChange, fmtPowerGain } from './figures';

const NO_CUSTOMER = '00000000-0000-0000-0000-000000000000';
export { DEFAULT_SHARE_DAYS } from '@shared/schemas/report';
/** Share-page look-ups allowed per IP address per minute (our own limit: generous for people, tight for guessing). */
export const SHARE_RATE_RULE = { limit: 60, windowSeconds: 60 };

const sha256 = (b: Buffer | string) => createHash('sha256').update(b).digest('hex');
const standardLabel = (id: string) => CORRECTION_STANDARDS.find((c) => c.id === id)?.label ?? id;
const bikeLabel = (b: Bike) => [b.year, b.make, b.model].filter((v) => v !== null && v !== undefined && v !== '').join(' ');

function reportScope(actor: Actor): FilterQuery<Report> {
  const where: Record<string, unknown> = { shop: actor.shopId };
  if (actor.role === 'customer') where.bike = { customer: actor.customerId ?? NO_CUSTOMER };
  return where as FilterQuery<Report>;
}

// ---- building the report's content

function curvesOf(preview: ComparisonPreview): ReportData['curves'] {
  return preview.curves.runs.map((c) => {
    const rpm: number[] = [];
    const powerHp: number[] = [];
    const torqueLbft: number[] = [];
    preview.curves.rpm.forEach((r, i) => {
      const p = c.powerHp[i];
      const t = c.torqueLbft[i];
      if (p !== null && t !== null) {
        rpm.push(r);
        powerHp.push(p);
        torqueLbft.push(t);
      }
    });
    return { runId: c.runId, rpm, powerHp, torqueLbft };
  });
}

function repeatabilityText(preview: ComparisonPreview, units: Shop['units']): ReportData['repeatability'] {
  const rep = preview.repeatability;
  if (!rep.length) {
    return { text: 'Each stage here was measured with one run, so the run-to-run spread is not known; treat small differences with care.', runs: 0, peakPowerSpreadHp: null };
  }
  const parts = rep.map((r) => `${r.stageName}: ${r.runs} runs, peak power within ${fmtPowerGain(r.peakPowerSpreadHp, units).replace(/^\+/, '')} of each other`);
  const worst = Math.max(...rep.map((r) => r.peakPowerSpreadHp));
  return {
    text: `Repeatability: ${parts.join('; ')}. Differences smaller than the spread are within run-to-run variation.`,
    runs: rep.reduce((s, r) => s + r.runs, 0),
    peakPowerSpreadHp: worst,
  };
}

/**
 * The build stages the report lists — every stage of the bike from the earliest to the latest stage
 * in the comparison, in build order, so stages in between without a run still show — and the cost
 * behind the headline gain: every stage after the baseline's stage up to the compared run's stage
 * (the rule of the stage timeline, ../comparisons/stage-cost.ts).
 */
async function stagesOf(em: EntityManager, actor: Actor, preview: ComparisonPreview, comparedRunId: string | null): Promise<{ stages: ReportStage[]; cost: { totalCostCents: number; fromStageName: string; stageNames: string[] } | null }> {
  const ids = new Set(preview.runs.map((r) => r.stageId).filter((s): s is string => !!s));
  if (!ids.size) return { stages: [], cost: null };
  const bikeIds = [...new Set(preview.runs.map((r) => r.bikeId).filter((b): b is string => !!b))];
  const all = await em.find(Stage, { bike: { $in: bikeIds }, shop: actor.shopId }, { orderBy: { position: 'asc', createdAt: 'asc' } });
  const baseStageId = preview.baseline.stageId;
  const comparedStageId = comparedRunId ? preview.runs.find((r) => r.runId === comparedRunId)?.stageId ?? null : null;
  const bikeOfBaseline = all.find((st) => st.id === baseStageId)?.bike.id;
  // One bike's build: the baseline's (a comparison across bikes lists only the stages it used).
  const build = bikeOfBaseline ? all.filter((st) => st.bike.id === bikeOfBaseline) : [];
  const used = build.map((st, i) => (ids.has(st.id) ? i : -1)).filter((i) => i >= 0);
  const listed = used.length ? build.slice(Math.min(...used), Math.max(...used) + 1) : [];
  const others = all.filter((st) => ids.has(st.id) && !listed.includes(st));
  const shown = [...listed, ...others];
  const parts = shown.length ? await em.find(Part, { stage: { $in: [...new Set([...shown, ...build].map((s) => s.id))] }, shop: actor.shopId }, { orderBy: { createdAt: 'asc' } }) : [];
  const partsOf = (id: string) => parts.filter((p) => p.stage.id === id);
  const out = shown.map((st) => {
    const own = partsOf(st.id);
    return {
      name: st.name,
      date: st.date,
      isBaseline: st.id === baseStageId,
      parts: own.map((p) => ({ category: p.category, description: p.description, partCostCents: p.partCostCents, labourCostCents: p.labourCostCents })),
      totalCostCents: stageCostCents(st, own),
    };
  });
  const costed = build.map((st) => ({ id: st.id, name: st.name, costCents: stageCostCents(st, partsOf(st.id)) }));
  const between = costBetweenStages(costed, baseStageId, comparedStageId);
  const baseName = build.find((st) => st.id === baseStageId)?.name ?? 'the baseline';
  return {
    stages: out,
    cost: between && between.totalCents > 0 ? { totalCostCents: between.totalCents, fromStageName: baseName, stageNames: between.stages.map((x) => x.name) } : null,
  };
}

/** Everything the PDF prints, from the saved comparison evaluated now. */
export async function buildReportData(
  em: EntityManager,
  actor: Actor,
  comparisonId: string,
  meta: { number: string; version: number; createdAt: Date; technicianNote: string | null },
): Promise<{ data: ReportData; preview: ComparisonPreview; shop: Shop; bike: Bike }> {
  const detail = await getComparison(em, actor, comparisonId);
  if (!detail.preview) throw new AppError('COMPARISON_NOT_COMPUTABLE', `This comparison cannot be reported on: ${detail.previewError?.message ?? 'its figures could not be computed'}`, 422);
  const shop = await em.findOneOrFail(Shop, actor.shopId);
  // The figures are the comparison's; only the sentences follow the shop's units.
  const options = { ...(detail.comparison.options as ComparisonOptions), units: shop.units === 'metric' ? 'kw-nm' : 'hp-lbft' } as ComparisonOptions;
  // The saved comparison's colours (each run keeps the colour it has on screen).
  const colorSlots = Object.fromEntries(detail.preview.runs.map((r) => [r.runId, r.colorIndex]));
  const preview = await evaluateComparison(em, actor, { runIds: detail.comparison.runIds, baselineRunId: detail.comparison.baselineRunId, options, colorSlots });
  const bike = await em.findOneOrFail(Bike, { id: detail.comparison.bikeId, shop: actor.shopId }, { populate: ['customer'] });
  const dynoIds = [...new Set(preview.runs.map((r) => r.dynoId).filter((d): d is string => !!d))];
  const dynos = dynoIds.length ? await em.find(Dyno, { id: { $in: dynoIds }, shop: actor.shopId }) : [];
  const kindLabel: Record<string, string> = { inertia: 'inertia', 'eddy-current': 'eddy-current', other: 'other type' };
  const last = preview.results[preview.results.length - 1];
  const { stages, cost } = await stagesOf(em, actor, preview, last?.runId ?? null);

  const data: ReportData = {
    number: meta.number,
    version: meta.version,
    createdAt: meta.createdAt.toISOString(),
    shop: { name: shop.name, address: shop.address, phone: shop.phone, email: shop.email },
    units: shop.units,
    paperSize: shop.paperSize,
    customer: { name: bike.customer.name },
    bike: { make: bike.make, model: bike.model, year: bike.year, vin: bike.vin, engineFamily: bike.engineFamily, displacementCc: bike.displacementCc },
    comparison: { id: detail.comparison.id, name: detail.comparison.name },
    runs: preview.runs.map((r, i) => {
      const dyno = dynos.find((d) => d.id === r.dynoId);
      return {
        id: r.runId,
        label: r.name,
        stageName: r.stageName,
        isBaseline: r.runId === preview.baseline.runId,
        colorIndex: r.colorIndex ?? i,
        recordedAt: r.recordedAt,
        dynoName: r.dynoName,
        dynoKind: dyno ? kindLabel[dyno.kind] ?? dyno.kind : null,
        conditions: r.conditions,
        correctionStandard: r.correction.standard,
        correctionLabel: standardLabel(r.correction.standard),
        correctionFactor: r.correction.standard === 'none' ? null : r.correction.factor,
        peakPower: r.peakPower,
        peakTorque: r.peakTorque,
      };
    }),
    gains: preview.results.map((g) => ({
      runId: g.runId,
      peakPowerGain: g.peakPowerGain,
      peakTorqueGain: g.peakTorqueGain,
      areaGainPct: g.areaGainPct,
      averagePowerGainHp: g.averagePowerGainHp,
      bands: g.bands.map((b) => ({ from: b.from, to: b.to, averagePowerGainHp: b.averagePowerGainHp })),
      largestGain: g.largestGain,
      largestLoss: g.largestLoss,
    })),
    curves: curvesOf(preview),
    stages,
    repeatability: repeatabilityText(preview, shop.units),
    cost: last && cost ? { ...cost, gainHp: last.peakPowerGain.hp } : null,
    warnings: preview.warnings.map((w) => w.message),
    summary: preview.summary.join(' '),
    technicianNote: meta.technicianNote,
  };
  return { data, preview, shop, bike };
}

// ---- DTOs

export type ReportDto = ReportSummary;

function toDto(r: Report): ReportDto {
  const data = r.summary as unknown as ReportData | null;
  const head = data?.gains?.length ? data.gains[data.gains.length - 1] : null;
  return {
    id: r.id,
    number: r.number,
    version: r.version,
    bikeId: r.bike.id,
    bikeLabel: r.bike.make ? bikeLabel(r.bike) : '',
    comparisonId: r.comparison.id,
    comparisonName: data?.comparison?.name ?? '',
    createdAt: r.createdAt.toISOString(),
    createdByName: r.createdBy?.name ?? null,
    technicianNote: r.technicianNote,
    pdfUrl: `/api/reports/${r.id}/pdf`,
    pdfSha256: r.pdfSha256,
    pdfSizeBytes: r.pdfSizeBytes,
    headline: head && data ? { peakPowerGain: fmtPowerGain(head.peakPowerGain.hp, data.units), areaGain: fmtPctChange(head.areaGainPct) } : null,
  };
}

async function findReport(em: EntityManager, actor: Actor, id: string): Promise<Report> {
  const r = await em.findOne(Report, { ...(reportScope(actor) as object), id } as FilterQuery<Report>, { populate: ['bike', 'bike.customer', 'comparison', 'createdBy'] });
  if (!r) throw notFound('Report');
  return r;
}

// ---- generating

/** Report number for a new report: "R-<year>-<4-digit sequence>" per shop and year. */
async function nextNumber(em: EntityManager, shopId: string, year: number): Promise<string> {
  const rows = (await em.getConnection().execute(`select count(distinct number)::int as n from report where shop_id = ? and number like ?`, [shopId, `R-${year}-%`])) as { n: number }[];
  return `R-${year}-${String((rows[0]?.n ?? 0) + 1).padStart(4, '0')}`;
}

export async function createReport(deps: AppDeps, em: EntityManager, actor: Actor, input: { comparisonId: string; technicianNote?: string | null }) {
  const comparison = await em.findOne(Comparison, { id: input.comparisonId, shop: actor.shopId });
  if (!comparison) throw notFound('Comparison');
  let storedKey: string | null = null; // set once the PDF is in storage
  return em.transactional(async (tx) => {
    // One report number at a time per shop, so numbers and versions never collide.
    await tx.getConnection().execute('select pg_advisory_xact_lock(hashtext(?))', [`report-number:${actor.shopId}`], 'all', tx.getTransactionContext());
    const previous = await tx.findOne(Report, { shop: actor.shopId, comparison: comparison.id }, { orderBy: { version: 'desc' } });
    const createdAt = new Date();
    const number = previous?.number ?? (await nextNumber(tx, actor.shopId, createdAt.getUTCFullYear()));
    const version = (previous?.version ?? 0) + 1;
    const technicianNote = input.technicianNote === undefined ? (previous?.technicianNote ?? null) : input.technicianNote;
    const { data, shop, bike } = await buildReportData(tx, actor, comparison.id, { number, version, createdAt, technicianNote });
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
  }).catch(async (err: unknown) => {
    // The row did not commit after the PDF was stored: remove the object (or record it for the start-up pass).
    if (storedKey) {
      const why = (err instanceof Error ? err.message : String(err)).split(' - ').pop()!.slice(0, 300);
      await discardObject(deps, storedKey, `report row for ${storedKey} did not commit: ${why}`);
    }
    throw err;
  });
}

export async function listReports(em: EntityManager, actor: Actor, query: { bikeId?: string; comparisonId?: string }): Promise<ReportDto[]> {
  const where = { ...(reportScope(actor) as object) } as Record<string, unknown>;
  if (query.bikeId) where.bike = actor.role === 'customer' ? { id: query.bikeId, customer: actor.customerId ?? NO_CUSTOMER } : query.bikeId;
  if (query.comparisonId) where.comparison = query.comparisonId;
  const rows = await em.find(Report, where as FilterQuery<Report>, { populate: ['bike', 'comparison', 'createdBy'], orderBy: [{ createdAt: 'desc' }, { version: 'desc' }], limit: 500 });
  return rows.map(toDto);
}

export async function getReport(em: EntityManager, actor: Actor, id: string) {
  const r = await findReport(em, actor, id);
  const versions = await em.find(Report, { shop: actor.shopId, number: r.number }, { orderBy: { version: 'desc' }, populate: ['bike', 'comparison', 'createdBy'] });
  const customer = r.bike.customer;
  return {
    ...toDto(r),
    customer: { id: customer.id, name: customer.name, email: actor.role === 'customer' ? null : customer.email },
    data: r.summary as unknown as ReportData,
    versions: versions.map(toDto),
  };
}

export async function reportPdf(deps: AppDeps, em: EntityManager, actor: Actor, id: string) {
  const r = await findReport(em, actor, id);
  return { report: r, stream: await deps.storage.getStream(r.pdfKey) };
}

export const pdfFileName = (r: Report) => `gain-report-${r.number}-v${r.version}.pdf`;

// ---- share links

function newToken() {
  // 32 random bytes = 256 bits; base64url gives 43 characters.
  const token = randomBytes(32).toString('base64url');
  return { token, hash: sha256(token) };
}

const shareUrl = (deps: AppDeps, token: string) => `${deps.config.PUBLIC_URL.replace(/\/$/, '')}/share/${token}`;

function shareStatus(l: ShareLink, now = new Date()): 'active' | 'expired' | 'revoked' {
  if (l.revokedAt) return 'revoked';
  if (l.expiresAt <= now) return 'expired';
  return 'active';
}

const toShareDto = (l: ShareLink) => ({
  id: l.id,
  createdAt: l.createdAt.toISOString(),
  expiresAt: l.expiresAt.toISOString(),
  revokedAt: l.revokedAt?.toISOString() ?? null,
  viewCount: l.viewCount,
  lastViewedAt: l.lastViewedAt?.toISOString() ?? null,
  status: shareStatus(l),
});

export async function createShareLink(deps: AppDeps, em: EntityManager, actor: Actor, reportId: string, expiresInDays = DEFAULT_SHARE_DAYS) {
  const report = await findReport(em, actor, reportId);
  const { token, hash } = newToken();
  const link = em.create(ShareLink, {
    shop: em.getReference(Shop, actor.shopId),
    report,
    tokenHash: hash,
    expiresAt: new Date(Date.now() + expiresInDays * 86_400_000),
    createdBy: em.getReference(User, actor.id),
  } as ShareLink);
  await em.flush();
  await recordAudit(em, actor, 'report.share', 'report', report.id, { shareId: link.id, expiresAt: link.expiresAt.toISOString() });
  return { ...toShareDto(link), url: shareUrl(deps, token) };
}

export async function listShareLinks(em: EntityManager, actor: Actor, reportId: string) {
  const report = await findReport(em, actor, reportId);
  const links = await em.find(ShareLink, { shop: actor.shopId, report: { number: report.number } }, { orderBy: { createdAt: 'desc' }, populate: ['report'] });
  return links.map((l) => ({ ...toShareDto(l), reportVersion: l.report.version }));
}

export async function revokeShareLink(em: EntityManager, actor: Actor, reportId: string, shareId: string) {
  const report = await findReport(em, actor, reportId);
  const link = await em.findOne(ShareLink, { id: shareId, shop: actor.shopId, report: report.id });
  if (!link) throw notFound('Share link');
  if (!link.revokedAt) {
    link.revokedAt = new Date();
    await em.flush();
    await recordAudit(em, actor, 'report.unshare', 'report', report.id, { shareId });
  }
  return toShareDto(link);
}

/** Unknown, expired and revoked tokens all get exactly this answer. */
export const shareNotFound = () => new AppError('NOT_FOUND', 'This link is not valid. It may have expired or been withdrawn; ask the shop for a new one.', 404);

const TOKEN_FORMAT = /^[A-Za-z0-9_-]{43}$/;

async function resolveShare(em: EntityManager, token: string, ip: string): Promise<ShareLink> {
  await hitRateLimit(em, `share:${ip}`, SHARE_RATE_RULE, 'Too many requests for shared reports from this address; wait a minute and try again.');
  if (!TOKEN_FORMAT.test(token)) throw shareNotFound();
  const link = await em.findOne(ShareLink, { tokenHash: sha256(token) }, { populate: ['report', 'report.shop', 'report.bike'] });
  if (!link || shareStatus(link) !== 'active') throw shareNotFound();
  return link;
}

/** The public share page: that report's summary and chart data and the shop's name, nothing else. */
export async function viewShare(em: EntityManager, token: string, ip: string) {
  const link = await resolveShare(em, token, ip);
  await em.getConnection().execute('update share_link set view_count = view_count + 1, last_viewed_at = now() where id = ?', [link.id]);
  const r = link.report;
  const d = r.summary as unknown as ReportData;
  return {
    shopName: r.shop.name,
    number: r.number,
    version: r.version,
    createdAt: r.createdAt.toISOString(),
    expiresAt: link.expiresAt.toISOString(),
    bikeLabel: bikeLabel(r.bike),
    units: d.units,
    summary: d.summary,
    warnings: d.warnings,
    runs: d.runs.map((x) => ({ id: x.id, label: x.label, isBaseline: x.isBaseline, colorIndex: x.colorIndex, correctionLabel: x.correctionLabel, peakPower: x.peakPower, peakTorque: x.peakTorque })),
    gains: d.gains,
    curves: d.curves,
    pdfUrl: `/api/share/${token}/pdf`,
  };
}

export async function sharePdf(deps: AppDeps, em: EntityManager, token: string, ip: string) {
  const link = await resolveShare(em, token, ip);
  return { report: link.report, stream: await deps.storage.getStream(link.report.pdfKey) };
}

// ---- sending

const toDeliveryDto = (d: ReportDelivery) => ({
  id: d.id,
  to: d.to,
  subject: d.subject,
  message: d.message,
  status: d.status,
  error: d.error,
  sentByName: d.sentBy?.name ?? null,
  createdAt: d.createdAt.toISOString(),
  reportVersion: d.report.version,
});

export function defaultMessage(data: Pick<ReportData, 'customer' | 'bike' | 'shop'>): string {
  const first = data.customer.name.split(/\s+/)[0] || data.customer.name;
  return `Hello ${first},\n\nHere is the gain report for your ${[data.bike.year, data.bike.make, data.bike.model].filter(Boolean).join(' ')}. The PDF is attached, and the link below shows the figures and chart online.\n\nThank you,\n${data.shop.name}`;
}

export async function sendReport(deps: AppDeps, em: EntityManager, actor: Actor, reportId: string, input: { to: string; message: string }) {
  const report = await findReport(em, actor, reportId);
  const data = report.summary as unknown as ReportData;
  const share = await createShareLink(deps, em, actor, report.id);
  const subject = `Gain report ${report.number} for your ${bikeLabel(report.bike)} — ${data.shop.name}`;
  const text = `${input.message.trim()}\n\nView online (link valid until ${share.expiresAt.slice(0, 10)}): ${share.url}\n\n— Dyno figures depend on the dyno, the correction standard and the conditions; compare like with like. The PDF explains the figures and the cautions that go with them.`;
  const delivery = em.create(ReportDelivery, {
    shop: em.getReference(Shop, actor.shopId),
    report,
    to: input.to,
    subject,
    message: input.message,
    status: 'failed',
    sentBy: em.getReference(User, actor.id),
  } as ReportDelivery);
  try {
    const pdf = await deps.storage.getBuffer(report.pdfKey);
    if (sha256(pdf) !== report.pdfSha256) throw new Error('the stored PDF does not match its recorded hash');
    const { messageId } = await deps.mailer.send({ shopId: actor.shopId, to: input.to, subject, text, attachments: [{ filename: pdfFileName(report), content: pdf, contentType: 'application/pdf' }] });
    delivery.status = 'sent';
    delivery.messageId = messageId;
  } catch (e) {
    delivery.status = 'failed';
    delivery.error = e instanceof Error ? e.message.slice(0, 2000) : String(e);
  }
  await em.flush();
  await em.populate(delivery, ['sentBy']);
  await recordAudit(em, actor, 'report.send', 'report', report.id, { to: input.to, status: delivery.status });
  const dto = toDeliveryDto(delivery);
  if (delivery.status === 'failed') throw new AppError('MAIL_FAILED', `The report could not be sent: ${delivery.error}`, 502, { delivery: dto });
  return { ...dto, shareUrl: share.url };
}

export async function listDeliveries(em: EntityManager, actor: Actor, reportId: string) {
  const report = await findReport(em, actor, reportId);
  const rows = await em.find(ReportDelivery, { shop: actor.shopId, report: { number: report.number } }, { orderBy: { createdAt: 'desc' }, populate: ['sentBy', 'report'] });
  return rows.map(toDeliveryDto);
}
