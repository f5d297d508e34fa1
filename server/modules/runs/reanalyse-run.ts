/** Re-deriving a run from its archived raw file, without writing anything. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { AppDeps } from '../../app-deps';
import { AppError } from '../../lib/errors';
import type { ColumnMapping } from '@shared/analysis/index';
import type { Run } from './run.entity';
import { sha256Hex } from './raw-store';
import { analyseRun, analysisContext, shopLayouts, type AnalysisOutcome } from './run-analysis';
import { reanalysisChanges, type ReanalysisChange } from './reprocess-diff';

/**
 * Re-derive a run from its raw file (after an analysis change, a new mapping or new session
 * conditions). With `mapping`, that mapping is used; otherwise the run's own, a saved layout,
 * or recognition. Answers the outcome and what it would change; the run is left untouched.
 */
export async function reanalyseRun(em: EntityManager, deps: AppDeps, run: Run, opts: { mapping?: ColumnMapping | null } = {}): Promise<{ outcome: AnalysisOutcome; changes: ReanalysisChange[] }> {
  await em.populate(run, ['session', 'shop', 'curve'] as never);
  const bytes = await deps.storage.getBuffer(run.rawKey);
  if (sha256Hex(bytes) !== run.rawSha256) throw new AppError('RAW_MISMATCH', 'The stored file does not match its recorded SHA-256; it was not re-processed.', 500);
  const layouts = await shopLayouts(em, run.shop.id);
  const ctx = analysisContext(run.session, run.shop);
  const explicit = opts.mapping !== undefined ? opts.mapping : ((run.mapping as ColumnMapping | null) ?? null);
  const outcome = await analyseRun(bytes, ctx, layouts, explicit);
  return { outcome, changes: reanalysisChanges(run, outcome) };
}
