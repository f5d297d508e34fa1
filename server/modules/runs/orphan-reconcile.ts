/**
 * Start-up reconciliation: objects written to storage whose row never committed (a run's raw
 * file, a report's PDF; see lib/storage/discard-object.ts) and whose immediate removal failed are
 * listed in orphan_object; remove them now. An object that a row does reference — a run's raw
 * key (the same file uploaded again since), a report's PDF key or a shop's logo key — is kept.
 */
import type { AppDeps } from '../../app-deps';
import { OrphanObject } from '../../lib/storage/orphan-object.entity';
import { Run } from './run.entity';
import { Report } from '../reports/report.entity';
import { Shop } from '../shops/shop.entity';

export async function reconcileOrphanObjects(deps: AppDeps, opts: { limit?: number } = {}): Promise<{ removed: number; kept: number; failed: number }> {
  const em = deps.orm.em.fork();
  const orphans = await em.find(OrphanObject, {}, { orderBy: { createdAt: 'asc' }, limit: opts.limit ?? 1000 });
  const out = { removed: 0, kept: 0, failed: 0 };
  for (const o of orphans) {
    try {
      const referenced = (await em.count(Run, { rawKey: o.key })) > 0 || (await em.count(Report, { pdfKey: o.key })) > 0 || (await em.count(Shop, { logoKey: o.key })) > 0;
      if (referenced) out.kept++;
      else {
        await deps.storage.delete(o.key);
        out.removed++;
      }
      em.remove(o);
      await em.flush();
    } catch {
      out.failed++; // storage still down: try again at the next start
    }
  }
  return out;
}
