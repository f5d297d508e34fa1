/** Which runs an actor may reach, and loading one of them (404 outside the scope, never 403). */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { tenantScope } from '../../http/tenant-scope';
import { notFound } from '../../lib/errors';
import { Run } from './run.entity';
import { RUN_POPULATE } from './run-dto';

/**
 * The tenant scope of runs (the shop, and for customers their own bikes), without deleted runs
 * unless asked for; customers never see deleted runs.
 */
export function runScope(actor: Actor, opts: { includeDeleted?: boolean } = {}) {
  const live = !opts.includeDeleted || actor.role === 'customer';
  return tenantScope<Run>(actor, 'bike.customer', live ? { deletedAt: null } : {});
}

/** A run the actor may see, or 404 (never 403). Owners also reach deleted runs (to restore them). */
export async function getRunEntity(em: EntityManager, actor: Actor, id: string, opts: { includeDeleted?: boolean; curve?: boolean } = {}): Promise<Run> {
  const includeDeleted = opts.includeDeleted ?? actor.role === 'owner';
  const populate = [...RUN_POPULATE, 'session.dyno', 'uploadedBy', ...(opts.curve ? ['curve'] : [])];
  const run = await em.findOne(Run, { ...(runScope(actor, { includeDeleted }) as object), id }, { populate: populate as never });
  if (!run) throw notFound('Run');
  return run;
}
