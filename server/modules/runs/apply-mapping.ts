/** Mapping a run's columns by hand: re-analyse with that mapping, optionally save it as a layout. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { z } from 'zod';
import type { AppDeps } from '../../app-deps';
import type { Actor } from '../../http/actor';
import { AppError } from '../../lib/errors';
import type { ColumnMapping } from '@shared/analysis/index';
import type { RunDetailDto, applyMappingInput } from '@shared/schemas/run';
import { ColumnLayout } from './run.entity';
import { Shop } from '../shops/shop.entity';
import { recordAudit } from '../audit/audit.service';
import { toRunDetail } from './run-dto';
import { getRunEntity } from './run-scope';
import { reanalyseRun } from './reanalyse-run';
import { saveOutcome } from './save-outcome';
import { addMissingPullRuns } from './pull-runs';

/**
 * A mapping that still does not read the file answers 422 and changes nothing. Otherwise the run,
 * the saved layout and their audit lines commit together.
 */
export async function applyMapping(em: EntityManager, deps: AppDeps, actor: Actor, id: string, input: z.output<typeof applyMappingInput>): Promise<RunDetailDto> {
  const run = await getRunEntity(em, actor, id, { includeDeleted: false, curve: true });
  const mapping = (input.mapping ?? null) as ColumnMapping | null;
  const { outcome, all } = await reanalyseRun(em, deps, run, { mapping, rpmPerSpeed: input.rpmPerSpeed ?? null });
  if (outcome.status !== 'ready') {
    const err = outcome.error ?? { code: 'MAPPING_INVALID' as const, message: 'That mapping does not fit the file' };
    throw new AppError(err.code, `With that mapping the file still cannot be read: ${err.message}`, 422, err.details);
  }
  await em.transactional(async (tem) => {
    await saveOutcome(tem, run, outcome);
    // Once readable, the log may turn out to hold several pulls: each becomes a run of its own.
    await addMissingPullRuns(tem, actor, run, all);
    let layoutId: string | null = null;
    if (input.saveLayoutName && mapping && outcome.headerSignature) {
      const existing = await tem.findOne(ColumnLayout, { shop: actor.shopId, headerSignature: outcome.headerSignature });
      const layout = existing ?? tem.create(ColumnLayout, { shop: tem.getReference(Shop, actor.shopId), headerSignature: outcome.headerSignature, name: input.saveLayoutName, mapping: {} } as unknown as ColumnLayout);
      layout.name = input.saveLayoutName;
      layout.mapping = { ...mapping };
      await tem.flush();
      layoutId = layout.id;
      await recordAudit(tem, actor, existing ? 'column-layout.update' : 'column-layout.create', 'column-layout', layout.id, { name: layout.name, headerSignature: layout.headerSignature });
    }
    await recordAudit(tem, actor, 'run.mapping', 'run', run.id, { mapping: mapping ? { ...mapping } : null, rpmPerSpeed: input.rpmPerSpeed ?? null, layoutId });
  });
  return toRunDetail(em, run);
}
