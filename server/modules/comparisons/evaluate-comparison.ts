/**
 * Use case: evaluate a comparison (the builder's preview, a saved comparison's figures, the gain
 * report's content). Reads the runs the actor may see, then hands them to the pure engine.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { AppError, notFound } from '../../lib/errors';
import { type ComparisonOptions, type ComparisonPreview, comparisonPreviewInput } from '@shared/schemas/comparison';
import { computeComparison, isComparisonEngineError } from './engine';
import { loadPreviewRows } from './comparison-runs';

/** Input of {@link evaluateComparison} (options may be partial; defaults are filled in). */
export interface EvaluateInput {
  runIds: string[];
  baselineRunId: string;
  options?: ComparisonOptions;
  /**
   * Colour slots to keep (a saved comparison's). Used only when every run has one; otherwise
   * (comparisons saved before slots were kept) all colours come from the archive.
   */
  colorSlots?: Record<string, number> | null;
}

/** The engine's typed errors as API errors: bad runs and ranges are 422 with the same code and details. */
export function engineErrorToAppError(e: unknown): unknown {
  return isComparisonEngineError(e) ? new AppError(e.code, e.message, e.code === 'NOT_FOUND' ? 404 : 422, e.details) : e;
}

function parseInput(input: EvaluateInput) {
  const parsed = comparisonPreviewInput.safeParse({ ...input, options: input.options ?? {} });
  if (!parsed.success) {
    const first = parsed.error.issues[0];
    throw new AppError('VALIDATION_FAILED', `Invalid comparison: ${first.path.join('.') || 'input'} — ${first.message}`, 400, {
      fields: parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })),
    });
  }
  return parsed.data;
}

/**
 * Computes a comparison: each run corrected (to `options.correction` when given, else its stored
 * correction), compared against the baseline over the common range, with fairness warnings,
 * run-to-run spread of every stage involved that has 2+ ready runs, and plain sentences.
 * Runs must all be visible to the actor (shop; customers: their own bikes) — else 404.
 */
export async function evaluateComparison(em: EntityManager, actor: Actor, input: EvaluateInput): Promise<ComparisonPreview> {
  const data = parseInput(input);
  const rows = await loadPreviewRows(em, actor, data.runIds);
  const visible = new Set(rows.map((r) => r.id));
  if (!data.runIds.every((id) => visible.has(id))) throw notFound('Run');
  try {
    return computeComparison(rows, { runIds: data.runIds, baselineRunId: data.baselineRunId, options: data.options, colorSlots: input.colorSlots });
  } catch (e) {
    throw engineErrorToAppError(e);
  }
}

/** The signature of {@link evaluateComparison}, for use cases that take it as a dependency. */
export type EvaluateComparison = typeof evaluateComparison;
