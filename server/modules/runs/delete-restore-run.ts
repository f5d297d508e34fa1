/** Soft-deleting a run (owners) and restoring it. The raw file stays in storage either way. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { AppError } from '../../lib/errors';
import type { RunSummaryDto } from '@shared/schemas/run';
import { Stage } from '../stages/stage.entity';
import { recordAudit } from '../audit/audit.service';
import { refreshBikeOutcomes } from '../builds/build-outcome.service';
import { runSummaryOf } from './run-dto';
import { getRunEntity } from './run-scope';

/** Deletes the run, releases any stage it represented (refreshing the bike's figures) and audits it, in one transaction. */
export async function deleteRun(em: EntityManager, actor: Actor, id: string): Promise<RunSummaryDto> {
  const run = await getRunEntity(em, actor, id, { includeDeleted: false });
  await em.transactional(async (tem) => {
    run.deletedAt = new Date();
    // A deleted run cannot represent a stage any more.
    const stages = await tem.find(Stage, { referenceRun: run.id });
    for (const s of stages) s.referenceRun = null;
    await tem.flush();
    if (stages.length) await refreshBikeOutcomes(tem, run.bike.id);
    await recordAudit(tem, actor, 'run.delete', 'run', run.id, { originalName: run.originalName, wasReferenceOf: stages.map((s) => s.id) });
  });
  return runSummaryOf(em, run);
}

export async function restoreRun(em: EntityManager, actor: Actor, id: string): Promise<RunSummaryDto> {
  const run = await getRunEntity(em, actor, id, { includeDeleted: true });
  if (!run.deletedAt) throw new AppError('NOT_DELETED', 'This run is not deleted', 409);
  await em.transactional(async (tem) => {
    run.deletedAt = null;
    await tem.flush();
    await recordAudit(tem, actor, 'run.restore', 'run', run.id, { originalName: run.originalName });
  });
  return runSummaryOf(em, run);
}
