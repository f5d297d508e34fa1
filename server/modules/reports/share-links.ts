/**
 * Use cases: share links of a report (create, list, revoke) and the public share page that a
 * link opens (its summary and chart data, its PDF). Tokens are stored only as their SHA-256.
 */
import { randomBytes } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import type { AppDeps } from '../../app-deps';
import { AppError, notFound } from '../../lib/errors';
import { hitRateLimit } from '../../lib/rate-limit';
import { DEFAULT_SHARE_DAYS, type PublicShare, type ShareLinkView } from '@shared/schemas/report';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';
import { recordAudit } from '../audit/audit.service';
import { Report, ShareLink } from './report.entity';
import type { ReportData } from './report-data';
import { bikeLabel, findReport, sha256 } from './report-access';

/** Share-page look-ups allowed per IP address per minute (our own limit: generous for people, tight for guessing). */
export const SHARE_RATE_RULE = { limit: 60, windowSeconds: 60 };

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

const toShareDto = (l: ShareLink): ShareLinkView => ({
  id: l.id,
  createdAt: l.createdAt.toISOString(),
  expiresAt: l.expiresAt.toISOString(),
  revokedAt: l.revokedAt?.toISOString() ?? null,
  viewCount: l.viewCount,
  lastViewedAt: l.lastViewedAt?.toISOString() ?? null,
  status: shareStatus(l),
});

/** A new link to a report (the token is in the answer's url only), recorded with its audit entry. */
export async function createShareLink(deps: AppDeps, em: EntityManager, actor: Actor, reportId: string, expiresInDays = DEFAULT_SHARE_DAYS): Promise<ShareLinkView & { url: string }> {
  const report = await findReport(em, actor, reportId);
  const { token, hash } = newToken();
  const link = await em.transactional(async (tx) => {
    const created = tx.create(ShareLink, {
      shop: tx.getReference(Shop, actor.shopId),
      report: tx.getReference(Report, report.id),
      tokenHash: hash,
      expiresAt: new Date(Date.now() + expiresInDays * 86_400_000),
      createdBy: tx.getReference(User, actor.id),
    } as ShareLink);
    await tx.flush();
    await recordAudit(tx, actor, 'report.share', 'report', report.id, { shareId: created.id, expiresAt: created.expiresAt.toISOString() });
    return created;
  });
  return { ...toShareDto(link), url: shareUrl(deps, token) };
}

export async function listShareLinks(em: EntityManager, actor: Actor, reportId: string): Promise<ShareLinkView[]> {
  const report = await findReport(em, actor, reportId);
  const links = await em.find(ShareLink, { shop: actor.shopId, report: { number: report.number } }, { orderBy: { createdAt: 'desc' }, populate: ['report'] });
  return links.map((l) => ({ ...toShareDto(l), reportVersion: l.report.version }));
}

export async function revokeShareLink(em: EntityManager, actor: Actor, reportId: string, shareId: string): Promise<ShareLinkView> {
  const report = await findReport(em, actor, reportId);
  const link = await em.findOne(ShareLink, { id: shareId, shop: actor.shopId, report: report.id });
  if (!link) throw notFound('Share link');
  if (!link.revokedAt) {
    await em.transactional(async (tx) => {
      tx.getReference(ShareLink, link.id).revokedAt = new Date();
      await tx.flush();
      await recordAudit(tx, actor, 'report.unshare', 'report', report.id, { shareId });
    });
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
export async function viewShare(em: EntityManager, token: string, ip: string): Promise<PublicShare> {
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
    runs: d.runs.map((x) => ({ id: x.id, label: x.label, fileName: x.fileName ?? null, isBaseline: x.isBaseline, colorIndex: x.colorIndex, correctionLabel: x.correctionLabel, peakPower: x.peakPower, peakTorque: x.peakTorque })),
    gains: d.gains,
    curves: d.curves,
    pdfUrl: `/api/share/${token}/pdf`,
  };
}

export async function sharePdf(deps: AppDeps, em: EntityManager, token: string, ip: string) {
  const link = await resolveShare(em, token, ip);
  return { report: link.report, stream: await deps.storage.getStream(link.report.pdfKey) };
}
