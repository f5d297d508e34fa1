/**
 * Use case: set the stage of several runs of one bike at once (bulk tagging from the upload
 * result or the session page). One transaction for all of them: concurrent single-run updates
 * of one stage race on the build index, and a batch should land whole or not at all.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { z } from 'zod';
import type { Actor } from '../../http/actor';
import { AppError, notFound } from '../../lib/errors';
import type { RunsStageDto, runsStageInput } from '@shared/schemas/run';
import { recordAudit } from '../audit/audit.service';
import { refreshBikeOutcomes } from '../builds/build-outcome.service';
import { Run } from './run.entity';
import { runScope } from './run-scope';
import { stageOfBike } from './update-run';

export async function tagRuns(em: EntityManager, actor: Actor, input: z.output<typeof runsStageInput>): Promise<RunsStageDto> {
  const ids = [...new Set(input.runIds)];
  const runs = await em.find(Run, { ...(runScope(actor) as object), id: { $in: ids } }, { populate: ['stage', 'bike'] as never });
  if (runs.length !== ids.length) throw notFound('Run');
  const bikeIds = new Set(runs.map((r) => r.bike.id));
  if (bikeIds.size !== 1) throw new AppError('VALIDATION_FAILED', 'The runs must all be of one bike.', 400, { fields: [{ path: 'runIds', message: 'The runs must all be of one bike' }] });
  const bikeId = runs[0].bike.id;
  let updated = 0;
  await em.transactional(async (tem) => {
    const stage = input.stageId ? await stageOfBike(tem, actor, input.stageId, bikeId) : null;
    let outcomesChanged = false;
    const changed: Run[] = [];
    for (const run of runs) {
      if ((run.stage?.id ?? null) === (stage?.id ?? null)) continue;
      const previous = run.stage;
      // A run that leaves its stage no longer represents it.
      if (previous && previous.referenceRun?.id === run.id) {
        previous.referenceRun = null;
        outcomesChanged = true;
      }
      run.stage = stage;
      changed.push(run);
    }
    await tem.flush();
    if (outcomesChanged) await refreshBikeOutcomes(tem, bikeId);
    for (const run of changed) await recordAudit(tem, actor, 'run.update', 'run', run.id, { stageId: stage?.id ?? null, bulk: true });
    updated = changed.length;
  });
  return { updated };
}
