/** Re-deriving a run from its archived raw file, without writing anything. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { AppDeps } from '../../app-deps';
import { AppError } from '../../lib/errors';
import type { ColumnMapping, RpmPerSpeed } from '@shared/analysis/index';
import type { Run } from './run.entity';
import { sha256Hex } from './raw-store';
import { analysePulls, analysisContext, pullOutcome, shopLayouts, type AnalysisOutcome } from './run-analysis';
import { reanalysisChanges, type ReanalysisChange } from './reprocess-diff';

/**
 * Re-derive a run from its raw file (after an analysis change, a new mapping or new session
 * conditions), reading only its own pull of the log. With `mapping` and/or `rpmPerSpeed`, that
 * choice is used; otherwise the run's own, a saved layout, or recognition. Answers the outcome,
 * what it would change, and the outcomes of every pull of the file (`all`); the run is left untouched.
 */
export async function reanalyseRun(em: EntityManager, deps: AppDeps, run: Run, opts: { mapping?: ColumnMapping | null; rpmPerSpeed?: RpmPerSpeed | null } = {}): Promise<{ outcome: AnalysisOutcome; changes: ReanalysisChange[]; all: AnalysisOutcome[] }> {
  await em.populate(run, ['session', 'shop', 'curve'] as never);
  const bytes = await deps.storage.getBuffer(run.rawKey);
  if (sha256Hex(bytes) !== run.rawSha256) throw new AppError('RAW_MISMATCH', 'The stored file does not match its recorded SHA-256; it was not re-processed.', 500);
  const layouts = await shopLayouts(em, run.shop.id);
  const ctx = analysisContext(run.session, run.shop);
  const given = opts.mapping !== undefined || opts.rpmPerSpeed !== undefined;
  const explicit = given
    ? { mapping: opts.mapping ?? null, rpmPerSpeed: opts.rpmPerSpeed ?? null }
    : { mapping: (run.mapping as ColumnMapping | null) ?? null, rpmPerSpeed: run.rpmPerSpeed ?? null };
  const all = await analysePulls(bytes, ctx, layouts, explicit);
  const outcome = pullOutcome(all, run.pullIndex);
  return { outcome, changes: reanalysisChanges(run, outcome), all };
}
