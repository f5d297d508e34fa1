/** Writing a fresh analysis outcome onto a stored run (hand mapping, re-processing). */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Run } from './run.entity';
import type { AnalysisOutcome } from './run-analysis';
import { applyOutcome } from './run-outcome';
import { Stage } from '../stages/stage.entity';
import { refreshBikeOutcomes } from '../builds/build-outcome.service';

/**
 * Applies the outcome and keeps the stages consistent: a run that is no longer usable stops
 * representing its stage, and the bike's derived stage figures follow any change of a reference
 * run. Call inside the transaction that also records the audit line.
 */
export async function saveOutcome(em: EntityManager, run: Run, outcome: AnalysisOutcome): Promise<void> {
  const wasReady = run.status === 'ready';
  applyOutcome(run, outcome);
  let refsChanged = false;
  if (wasReady || run.status !== 'ready') {
    const stages = await em.find(Stage, { referenceRun: run.id });
    if (stages.length) {
      refsChanged = true;
      if (run.status !== 'ready') for (const s of stages) s.referenceRun = null;
    }
  }
  await em.flush();
  if (refsChanged) await refreshBikeOutcomes(em, run.bike.id);
}
