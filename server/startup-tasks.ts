import type { StartupTask } from './startup';
import { reconcileOrphanObjects } from './modules/runs/orphan-reconcile';
import { removeStaleTempUploads } from './lib/temp-uploads';
import { logger } from './lib/logger';

/**
 * Removes what a crashed process left: stored objects whose rows never committed (runs' raw files,
 * reports' PDFs, logos; see orphan-reconcile.ts), unfinished multipart uploads, and temporary
 * upload files (lib/temp-uploads.ts).
 */
export const orphanObjectsTask: StartupTask = {
  name: 'orphan objects',
  async run(deps) {
    const temp = await removeStaleTempUploads(deps.config.UPLOAD_TMP_DIR, deps.config.UPLOAD_TMP_GRACE_SECONDS);
    if (temp) logger.info({ task: 'orphan objects', removed: temp }, 'removed temporary upload files');
    const r = await reconcileOrphanObjects(deps);
    if (r.skipped) return 'another instance is reconciling';
    if (r.removed || r.kept || r.failed || r.unfinishedRemoved || r.uploadsAborted) {
      return `removed ${r.removed}, kept ${r.kept} (still referenced), ${r.failed} left for the next run; ${r.unfinishedRemoved} object(s) of unfinished writes removed, ${r.uploadsAborted} multipart upload(s) aborted`;
    }
  },
};

/** Every start-up task, in the order main.ts runs them. Add a new task here by name. */
export const STARTUP_TASKS: readonly StartupTask[] = [orphanObjectsTask];
