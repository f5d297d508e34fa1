/** Editing a run: its stage, label, tags and note. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { z } from 'zod';
import type { Actor } from '../../http/actor';
import { notFound } from '../../lib/errors';
import type { RunDetailDto, runUpdateInput } from '@shared/schemas/run';
import { Stage } from '../stages/stage.entity';
import { recordAudit } from '../audit/audit.service';
import { refreshBikeOutcomes } from '../builds/build-outcome.service';
import { toRunDetail } from './run-dto';
import { getRunEntity } from './run-scope';

export type RunUpdateInput = z.output<typeof runUpdateInput>;

/** A stage of the same bike, or 404. */
export async function stageOfBike(em: EntityManager, actor: Actor, stageId: string, bikeId: string): Promise<Stage> {
  const stage = await em.findOne(Stage, { id: stageId, shop: actor.shopId, bike: bikeId });
  if (!stage) throw notFound('Stage');
  return stage;
}

/** Applies the edit, the bike's derived stage figures and the audit line in one transaction. */
export async function updateRun(em: EntityManager, actor: Actor, id: string, input: RunUpdateInput): Promise<RunDetailDto> {
  const run = await getRunEntity(em, actor, id, { includeDeleted: false });
  await em.transactional(async (tem) => {
    const changes: Record<string, unknown> = {};
    let outcomesChanged = false;
    if (input.stageId !== undefined && (input.stageId ?? null) !== (run.stage?.id ?? null)) {
      const previous = run.stage;
      run.stage = input.stageId ? await stageOfBike(tem, actor, input.stageId, run.bike.id) : null;
      // A run that leaves its stage no longer represents it.
      if (previous && previous.referenceRun?.id === run.id) {
        previous.referenceRun = null;
        outcomesChanged = true;
      }
      changes.stageId = run.stage?.id ?? null;
    }
    if (input.label !== undefined) run.label = changes.label = input.label;
    if (input.note !== undefined) run.note = changes.note = input.note;
    if (input.tags !== undefined) {
      run.tags = [...new Set(input.tags)];
      changes.tags = run.tags;
    }
    await tem.flush();
    if (outcomesChanged) await refreshBikeOutcomes(tem, run.bike.id);
    await recordAudit(tem, actor, 'run.update', 'run', run.id, changes);
  });
  return toRunDetail(em, run);
}
