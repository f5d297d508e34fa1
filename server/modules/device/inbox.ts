/**
 * The shop's inbox: run files that arrived from a dyno with nothing on it. Each is stored byte for
 * byte and read once for a summary; staff assign it to a bike (session, stage), which runs the
 * normal upload pipeline, so duplicates and multi-pull logs behave exactly as uploads do.
 */
import { randomUUID } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import { UniqueConstraintViolationException } from '@mikro-orm/core';
import type { AppDeps } from '../../app-deps';
import type { Actor } from '../../http/actor';
import { AppError, conflict, notFound } from '../../lib/errors';
import { tenantScope } from '../../http/tenant-scope';
import { discardObject } from '../../lib/storage/discard-object';
import { logger } from '../../lib/logger';
import type { Page } from '@shared/schemas/common';
import type { DeviceLanding } from '@shared/schemas/device';
import type { InboxAssignResponse, InboxItemDto } from '@shared/schemas/bay';
import { Shop } from '../shops/shop.entity';
import { Dyno } from '../dynos/dyno.entity';
import { User } from '../users/user.entity';
import { recordAudit } from '../audit/audit.service';
import { ingestFiles, loadTarget, type IncomingFile, type IngestTarget } from '../runs/upload-runs';
import { putRawFile, sha256Of } from '../runs/raw-store';
import { analyseUpload, analysisContext, shopLayouts, type AnalysisOutcome } from '../runs/run-analysis';
import { InboxItem, type InboxSummary } from './inbox-item.entity';
import type { DeviceCaller } from './device-auth';
import { deviceActor, viaToken } from './device-actor';

const INBOX_PAGE = 200;

/** One object per item (not per content), so removing an assigned item's copy never touches a newer arrival's. */
export const inboxKeyFor = (shopId: string, itemId: string) => `shops/${shopId}/inbox/${itemId}`;

/** What a first reading found, per pull (figures as the reader gives them, corrected with the shop's default standard). */
export function summarise(outcomes: AnalysisOutcome[]): InboxSummary {
  const ready = outcomes.filter((o) => o.status === 'ready' && o.result);
  return {
    pulls: outcomes.length,
    readable: ready.length,
    peaks: outcomes.map((o) => ({ hp: o.result?.peakPower.hp ?? null, rpm: o.result?.peakPower.rpm ?? null, lbft: o.result?.peakTorque.lbft ?? null })),
    error: ready.length ? null : (outcomes[0]?.error?.message ?? null),
  };
}

const toDto = (i: InboxItem): InboxItemDto => ({
  id: i.id,
  originalName: i.originalName,
  sizeBytes: i.sizeBytes,
  sha256: i.rawSha256,
  dynoId: i.dyno?.id ?? null,
  dynoName: i.dyno?.name ?? null,
  receivedAt: i.createdAt.toISOString(),
  summary: i.summary,
  repeats: i.repeats,
});

async function storageUp(deps: AppDeps) {
  try {
    await deps.storage.ping();
  } catch (err) {
    throw new AppError('STORAGE_UNAVAILABLE', 'File storage is not reachable right now; nothing was saved. Try again shortly.', 503, { cause: err instanceof Error ? err.name : String(err) });
  }
}

/** Files from a dyno with nothing on it: one waiting item per distinct content (the same file again is answered as a duplicate). */
export async function putInInbox(em: EntityManager, deps: AppDeps, caller: DeviceCaller, files: IncomingFile[]): Promise<DeviceLanding> {
  await storageUp(deps);
  const actor = await deviceActor(em, caller);
  const shop = await em.findOneOrFail(Shop, { id: caller.shopId });
  const layouts = await shopLayouts(em, caller.shopId);
  const landed: { id: string; duplicate: boolean; pulls: number }[] = [];
  for (const f of files) {
    const sha = await sha256Of(f);
    const waiting = await em.findOne(InboxItem, { shop: caller.shopId, rawSha256: sha, assignedAt: null });
    if (waiting) {
      await em.nativeUpdate(InboxItem, { id: waiting.id }, { repeats: waiting.repeats + 1 });
      landed.push({ id: waiting.id, duplicate: true, pulls: waiting.summary.pulls });
      continue;
    }
    const itemId = randomUUID();
    const key = inboxKeyFor(caller.shopId, itemId);
    const size = await putRawFile(deps, key, f);
    const summary = summarise(await analyseUpload(f.path !== undefined ? { path: f.path } : f.bytes, analysisContext(null, shop), layouts));
    try {
      const item = await em.transactional(async (tx) => {
        const row = tx.create(InboxItem, {
          id: itemId,
          shop: tx.getReference(Shop, caller.shopId),
          dyno: tx.getReference(Dyno, caller.dynoId),
          originalName: f.originalName,
          contentType: f.contentType,
          rawKey: key,
          rawSha256: sha,
          sizeBytes: size,
          summary,
        } as InboxItem);
        await recordAudit(tx, actor, 'inbox.receive', 'inbox-item', row.id, { file: f.originalName, sha256: sha, dynoId: caller.dynoId, pulls: summary.pulls, via: viaToken(caller) });
        return row;
      });
      landed.push({ id: item.id, duplicate: false, pulls: summary.pulls });
    } catch (err) {
      await discardObject(deps, key, `inbox item for ${f.originalName} did not commit`);
      if (!(err instanceof UniqueConstraintViolationException)) throw err;
      // The same file arrived at the same moment in another request: it is waiting already.
      const other = await em.fork().findOneOrFail(InboxItem, { shop: caller.shopId, rawSha256: sha, assignedAt: null });
      landed.push({ id: other.id, duplicate: true, pulls: other.summary.pulls });
    }
  }
  return { kind: 'inbox', itemId: landed[0].id, duplicate: landed.every((l) => l.duplicate), pulls: landed.reduce((n, l) => n + l.pulls, 0) };
}

/** Files waiting for a bike, oldest first. */
export async function listInbox(em: EntityManager, actor: Actor): Promise<Page<InboxItemDto>> {
  const [rows, total] = await em.findAndCount(InboxItem, tenantScope<InboxItem>(actor, undefined, { assignedAt: null }), { populate: ['dyno'], orderBy: { createdAt: 'asc', id: 'asc' }, limit: INBOX_PAGE });
  return { items: rows.map(toDto), total, page: 1, pageSize: INBOX_PAGE, nextCursor: null };
}

/**
 * Assigns a waiting file: the normal pipeline makes its runs (a file already archived for that
 * bike answers its runs as a duplicate). The item is then marked assigned and its inbox copy
 * removed (the runs have their own). A failed save leaves the item waiting.
 */
export async function assignInboxItem(em: EntityManager, deps: AppDeps, actor: Actor, id: string, target: IngestTarget): Promise<InboxAssignResponse> {
  const item = await em.findOne(InboxItem, tenantScope<InboxItem>(actor, undefined, { id }));
  if (!item) throw notFound('Inbox item');
  if (item.assignedAt) throw conflict('INBOX_ALREADY_ASSIGNED', 'This file was assigned already', { runIds: item.runIds });
  await loadTarget(em, actor, target, { requireSafety: false }); // checks bike, session and stage before any work
  await storageUp(deps);
  const bytes = await deps.storage.getBuffer(item.rawKey);
  const results = await ingestFiles(em, deps, actor, target, [{ originalName: item.originalName, contentType: item.contentType, bytes }], { via: 'inbox', requireSafety: false });
  const r = results[0];
  const runIds = r.runs ? r.runs.map((x) => x.id) : r.ok ? [r.run.id] : r.runId ? [r.runId] : [];
  if (!runIds.length) return { results }; // nothing saved: the file keeps waiting
  await em.transactional(async (tx) => {
    const row = await tx.findOneOrFail(InboxItem, { id: item.id });
    row.assignedAt = new Date();
    row.assignedBy = tx.getReference(User, actor.id);
    row.runIds = runIds;
    await recordAudit(tx, actor, 'inbox.assign', 'inbox-item', row.id, { file: row.originalName, bikeId: target.bikeId, sessionId: target.sessionId ?? null, stageId: target.stageId ?? null, runIds });
  });
  const fate = await discardObject(deps, item.rawKey, `inbox item ${item.id} assigned`).catch(() => 'lost');
  if (fate !== 'deleted') logger.warn({ key: item.rawKey, fate }, 'inbox copy of an assigned file was not removed');
  return { results };
}
