/** Re-processing a run: re-derive it from its raw file and save the result with an audit line. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { AppDeps } from '../../app-deps';
import type { Actor } from '../../http/actor';
import type { RunReprocessDto } from '@shared/schemas/run';
import type { Run } from './run.entity';
import { recordAudit } from '../audit/audit.service';
import { toRunDetail } from './run-dto';
import { getRunEntity } from './run-scope';
import { reanalyseRun } from './reanalyse-run';
import type { ReanalysisChange } from './reprocess-diff';
import { saveOutcome } from './save-outcome';

/**
 * Re-derive one run and save it; the change and its audit line commit together. `details` are
 * added to the audit line (the command line says it acted). An unchanged run is saved (its
 * derived columns may still differ below display rounding) but audited only when `auditUnchanged`.
 */
export async function reprocessRun(em: EntityManager, deps: AppDeps, actor: Actor, run: Run, opts: { details?: Record<string, unknown>; auditUnchanged?: boolean } = {}): Promise<ReanalysisChange[]> {
  const { outcome, changes } = await reanalyseRun(em, deps, run);
  await em.transactional(async (tem) => {
    await saveOutcome(tem, run, outcome);
    if (changes.length || (opts.auditUnchanged ?? true)) {
      await recordAudit(tem, actor, 'run.reprocess', 'run', run.id, { ...opts.details, changes: changes.map((c) => ({ ...c })) });
    }
  });
  return changes;
}

export async function reprocessRunById(em: EntityManager, deps: AppDeps, actor: Actor, id: string): Promise<RunReprocessDto> {
  const run = await getRunEntity(em, actor, id, { includeDeleted: false, curve: true });
  const changes = await reprocessRun(em, deps, actor, run);
  return { ...(await toRunDetail(em, run)), changes };
}
