import type { AppDeps } from '../../app-deps';
import { OrphanObject } from './orphan-object.entity';
import { logger } from '../logger';

/**
 * Remove an object whose database row never committed (a run's raw file, a report's PDF); if the
 * removal fails too, leave an orphan_object note for the start-up reconciliation pass.
 */
export async function discardObject(deps: Pick<AppDeps, 'storage' | 'orm'>, key: string, reason: string): Promise<'deleted' | 'recorded' | 'lost'> {
  try {
    await deps.storage.delete(key);
    return 'deleted';
  } catch {
    try {
      const em = deps.orm.em.fork();
      em.create(OrphanObject, { key, reason } as OrphanObject);
      await em.flush();
      return 'recorded';
    } catch (err) {
      logger.error({ err, key }, 'could not remove or record an orphan object');
      return 'lost';
    }
  }
}
