/** Use cases: saved comparisons — create, get (with figures computed now), list, delete. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { tenantScope } from '../../http/tenant-scope';
import { AppError, notFound } from '../../lib/errors';
import type { ComparisonDetailDto, ComparisonDto, ComparisonInput, ComparisonOptions } from '@shared/schemas/comparison';
import { Run } from '../runs/run.entity';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';
import { recordAudit } from '../audit/audit.service';
import { Comparison } from './comparison.entity';
import { bikeLabel } from './engine';
import { type EvaluateComparison, type EvaluateInput, evaluateComparison } from './evaluate-comparison';

function toDto(c: Comparison): ComparisonDto {
  return {
    id: c.id,
    name: c.name,
    bikeId: c.bike.id,
    bikeLabel: bikeLabel(c.bike),
    runIds: c.runIds,
    baselineRunId: c.baselineRun.id,
    options: c.options as ComparisonOptions,
    note: c.note,
    createdAt: c.createdAt.toISOString(),
    createdByName: c.createdBy?.name ?? null,
  };
}

/** Saves a comparison (after computing it once, so a saved comparison is always computable). */
export async function createComparison(em: EntityManager, actor: Actor, input: ComparisonInput): Promise<ComparisonDto> {
  const preview = await evaluateComparison(em, actor, input);
  return em.transactional(async (tx) => {
    const baseline = await tx.findOneOrFail(Run, { id: input.baselineRunId, shop: actor.shopId }, { populate: ['bike'] });
    const c = tx.create(Comparison, {
      shop: tx.getReference(Shop, actor.shopId),
      name: input.name,
      bike: baseline.bike,
      baselineRun: baseline,
      runIds: input.runIds,
      options: input.options as Record<string, unknown>,
      note: input.note ?? null,
      colorSlots: Object.fromEntries(preview.runs.map((r) => [r.runId, r.colorIndex])),
      createdBy: tx.getReference(User, actor.id),
    } as Comparison);
    await tx.flush();
    await recordAudit(tx, actor, 'comparison.create', 'comparison', c.id, { name: c.name, runIds: c.runIds });
    await tx.populate(c, ['createdBy', 'bike']);
    return toDto(c);
  });
}

/** A saved comparison the actor may see (customers: their own bikes), else 404. */
export async function findComparison(em: EntityManager, actor: Actor, id: string): Promise<Comparison> {
  const c = await em.findOne(Comparison, tenantScope<Comparison>(actor, 'bike.customer', { id }), { populate: ['bike', 'createdBy'] });
  if (!c) throw notFound('Comparison');
  return c;
}

/** What evaluates a saved comparison: its runs, baseline, options and kept colours. */
export const savedInput = (c: Comparison, options: ComparisonOptions = c.options as ComparisonOptions): EvaluateInput => ({
  runIds: c.runIds,
  baselineRunId: c.baselineRun.id,
  options,
  colorSlots: c.colorSlots,
});

/** Why a saved comparison's figures cannot be computed (a client error), or null for a server error. */
export function previewErrorOf(e: unknown): ComparisonDetailDto['previewError'] {
  if (e instanceof AppError && e.status < 500) {
    const message = e.status === 404 ? 'A run of this comparison was deleted or is not visible to you.' : e.message;
    return { code: e.code, message };
  }
  return null;
}

/** A saved comparison and its figures computed now (previewError says why when they cannot be). */
export async function getComparison(em: EntityManager, actor: Actor, id: string, evaluate: EvaluateComparison = evaluateComparison): Promise<ComparisonDetailDto> {
  const c = await findComparison(em, actor, id);
  const comparison = toDto(c);
  try {
    const preview = await evaluate(em, actor, savedInput(c));
    return { comparison, preview, previewError: null };
  } catch (e) {
    const previewError = previewErrorOf(e);
    if (previewError) return { comparison, preview: null, previewError };
    throw e;
  }
}

/** Saved comparisons, newest first, optionally of one bike. */
export { listComparisons } from './list-comparisons';

export async function deleteComparison(em: EntityManager, actor: Actor, id: string): Promise<void> {
  const c = await findComparison(em, actor, id);
  await em.transactional(async (tx) => {
    tx.remove(tx.getReference(Comparison, c.id));
    await tx.flush();
    await recordAudit(tx, actor, 'comparison.delete', 'comparison', id, { name: c.name });
  });
}
