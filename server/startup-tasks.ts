import type { StartupTask } from './startup';
import { reconcileOrphanObjects } from './modules/runs/orphan-reconcile';

/** Removes stored objects whose rows never committed (runs' raw files, reports' PDFs); see orphan-reconcile.ts. */
export const orphanObjectsTask: StartupTask = {
  name: 'orphan objects',
  async run(deps) {
    const r = await reconcileOrphanObjects(deps);
    if (r.removed || r.kept || r.failed) return `removed ${r.removed}, kept ${r.kept} (still referenced), ${r.failed} left for the next start`;
  },
};

/** Every start-up task, in the order main.ts runs them. Add a new task here by name. */
export const STARTUP_TASKS: readonly StartupTask[] = [orphanObjectsTask];
