/**
 * Reconciliation of stored objects with the rows that point to them, run at start-up and then
 * every RECONCILE_EVERY_SECONDS:
 *
 * - objects noted in orphan_object (their row never committed and their immediate removal failed;
 *   lib/storage/discard-object.ts) are removed;
 * - objects whose write was journaled (object_write; lib/storage/journaled-store.ts) more than
 *   ORPHAN_GRACE_SECONDS ago are removed unless a row points to them: a process killed between
 *   storing an object and committing its row leaves exactly such an entry;
 * - multipart uploads started that long ago and never completed are aborted.
 *
 * An object that a row does reference — a run's raw key, a report's PDF key or a shop's logo key —
 * is kept. Several instances may run this at once: a transaction-scoped advisory lock lets one do
 * the work and the others skip, so each orphan is removed once.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { AppDeps } from '../../app-deps';
import { OrphanObject } from '../../lib/storage/orphan-object.entity';
import { logger } from '../../lib/logger';
import { Run } from './run.entity';
import { Report } from '../reports/report.entity';
import { Shop } from '../shops/shop.entity';

export interface ReconcileResult {
  removed: number;
  kept: number;
  failed: number;
  /** Journaled writes whose object no row points to, removed. */
  unfinishedRemoved: number;
  /** Multipart uploads aborted. */
  uploadsAborted: number;
  /** Another instance was reconciling at the same moment; this one did nothing. */
  skipped: boolean;
}

const referenced = async (em: EntityManager, key: string) =>
  (await em.count(Run, { rawKey: key })) > 0 || (await em.count(Report, { pdfKey: key })) > 0 || (await em.count(Shop, { logoKey: key })) > 0;

export async function reconcileOrphanObjects(deps: AppDeps, opts: { limit?: number; graceSeconds?: number } = {}): Promise<ReconcileResult> {
  const grace = opts.graceSeconds ?? deps.config.ORPHAN_GRACE_SECONDS;
  const out: ReconcileResult = { removed: 0, kept: 0, failed: 0, unfinishedRemoved: 0, uploadsAborted: 0, skipped: false };
  await deps.orm.em.fork().transactional(async (em) => {
    const conn = em.getConnection();
    const ctx = em.getTransactionContext();
    const [lock] = (await conn.execute(`select pg_try_advisory_xact_lock(hashtext('pullbook:orphan-reconcile')) as locked`, [], 'all', ctx)) as { locked: boolean }[];
    if (!lock?.locked) {
      out.skipped = true;
      return;
    }
    const orphans = await em.find(OrphanObject, {}, { orderBy: { createdAt: 'asc' }, limit: opts.limit ?? 1000 });
    for (const o of orphans) {
      try {
        if (await referenced(em, o.key)) out.kept++;
        else {
          await deps.storage.delete(o.key);
          out.removed++;
        }
        em.remove(o);
        await em.flush();
      } catch {
        out.failed++; // storage still down: try again at the next run
      }
    }
    const writes = (await conn.execute(
      `select key from object_write where started_at < now() - make_interval(secs => ?) order by started_at limit ?`,
      [grace, opts.limit ?? 1000],
      'all',
      ctx,
    )) as { key: string }[];
    for (const { key } of writes) {
      try {
        if (!(await referenced(em, key))) {
          await deps.storage.delete(key);
          out.unfinishedRemoved++;
        }
        await conn.execute('delete from object_write where key = ? and started_at < now() - make_interval(secs => ?)', [key, grace], 'all', ctx);
      } catch {
        out.failed++;
      }
    }
  });
  if (!out.skipped && deps.storage.abortStaleUploads) {
    try {
      out.uploadsAborted = await deps.storage.abortStaleUploads(grace);
    } catch (err) {
      // The local S3 fake answers NotImplemented to the listing; real S3 and its peers list them.
      if ((err as { name?: string }).name === 'NotImplemented') logger.info('the object store cannot list unfinished multipart uploads; none aborted');
      else logger.warn({ err }, 'could not list or abort unfinished multipart uploads');
    }
  }
  return out;
}
