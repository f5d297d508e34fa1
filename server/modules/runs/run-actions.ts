/** Run actions that go back to the raw file: preview, hand mapping, re-processing. */
import type { ApiErrorCode } from '@shared/errors';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { z } from 'zod';
import type { AppDeps } from '../../app-deps';
import type { Actor } from '../../http/actor';
import { AppError } from '../../lib/errors';
import { detectLayout } from '@shared/analysis/layout';
import { decodeBytes } from '@shared/analysis/decode';
import { AnalysisError, type ColumnMapping } from '@shared/analysis/index';
import type { RunDetailDto, applyMappingInput } from '@shared/schemas/run';
import { ColumnLayout, type Run } from './run.entity';
import { Shop } from '../shops/shop.entity';
import { getRunEntity, toRunDetail } from './run.service';
import { applyOutcome, reanalyseRun, type ReanalysisChange } from './run-ingest';
import { recordAudit } from '../audit/audit.service';
import { refreshBikeOutcomes } from '../builds/build-outcome.service';
import { Stage } from '../stages/stage.entity';

export interface RunPreviewDto {
  runId: string;
  originalName: string;
  status: Run['status'];
  headers: string[];
  previewRows: string[][];
  suggestions: Record<string, unknown>;
  headerSignature: string | null;
  /** Roles the mapping must name (rpm, torque or power) when known. */
  needs: string[];
  /** The mapping last used, if any. */
  mapping: Record<string, unknown> | null;
}

const PREVIEW_ROWS = 10;

/** First rows of the raw file, for the mapping dialog. */
export async function runPreview(em: EntityManager, deps: AppDeps, actor: Actor, id: string): Promise<RunPreviewDto> {
  const run = await getRunEntity(em, actor, id, { includeDeleted: false });
  const help = (run.error?.details ?? null) as { headers?: string[]; previewRows?: string[][]; suggestions?: Record<string, unknown>; headerSignature?: string; needs?: string[] } | null;
  const base = { runId: run.id, originalName: run.originalName, status: run.status, mapping: run.mapping };
  if (help && Array.isArray(help.headers)) {
    return { ...base, headers: help.headers, previewRows: (help.previewRows ?? []).slice(0, PREVIEW_ROWS), suggestions: help.suggestions ?? {}, headerSignature: help.headerSignature ?? run.headerSignature, needs: help.needs ?? [] };
  }
  const bytes = await deps.storage.getBuffer(run.rawKey);
  try {
    const text = decodeBytes(bytes.subarray(0, 256 * 1024));
    const layout = detectLayout(text, bytes.length <= 256 * 1024);
    const headers = layout.header ?? Array.from({ length: layout.fieldCount }, (_, i) => `column ${i + 1}`);
    const suggestions: Record<string, unknown> = run.columns ? { rpm: run.columns.rpm, torque: run.columns.torque, power: run.columns.power } : {};
    return { ...base, headers, previewRows: layout.preview.slice(0, PREVIEW_ROWS), suggestions, headerSignature: run.headerSignature, needs: [] };
  } catch (e) {
    const msg = e instanceof AnalysisError ? e.message : 'The file could not be read as a table.';
    throw new AppError('NO_PREVIEW', `No preview: ${msg}`, 422);
  }
}

async function saveOutcome(em: EntityManager, run: Run, outcome: Parameters<typeof applyOutcome>[1]) {
  const wasReady = run.status === 'ready';
  applyOutcome(run, outcome);
  // A run that is no longer usable cannot represent a stage.
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

/** Re-analyse a run from its raw file with a hand mapping; optionally save it as a named layout. */
export async function applyMapping(em: EntityManager, deps: AppDeps, actor: Actor, id: string, input: z.output<typeof applyMappingInput>): Promise<RunDetailDto> {
  const run = await getRunEntity(em, actor, id, { includeDeleted: false, curve: true });
  const mapping = input.mapping as ColumnMapping;
  const { outcome } = await reanalyseRun(em, deps, run, { mapping });
  if (outcome.status !== 'ready') {
    const err = outcome.error ?? { code: 'MAPPING_INVALID', message: 'That mapping does not fit the file' };
    throw new AppError(err.code as ApiErrorCode, `With that mapping the file still cannot be read: ${err.message}`, 422, err.details);
  }
  await saveOutcome(em, run, outcome);
  let layoutId: string | null = null;
  if (input.saveLayoutName && outcome.headerSignature) {
    const existing = await em.findOne(ColumnLayout, { shop: actor.shopId, headerSignature: outcome.headerSignature });
    const layout = existing ?? em.create(ColumnLayout, { shop: em.getReference(Shop, actor.shopId), headerSignature: outcome.headerSignature, name: input.saveLayoutName, mapping: {} } as unknown as ColumnLayout);
    layout.name = input.saveLayoutName;
    layout.mapping = { ...mapping };
    await em.flush();
    layoutId = layout.id;
    await recordAudit(em, actor, existing ? 'column-layout.update' : 'column-layout.create', 'column-layout', layout.id, { name: layout.name, headerSignature: layout.headerSignature });
  }
  await recordAudit(em, actor, 'run.mapping', 'run', run.id, { mapping: { ...mapping }, layoutId });
  return toRunDetail(em, run);
}

/** Re-derive one run from its raw file; answers the run and what changed. */
export async function reprocessRun(em: EntityManager, deps: AppDeps, actor: Actor | null, run: Run): Promise<ReanalysisChange[]> {
  const { outcome, changes } = await reanalyseRun(em, deps, run);
  await saveOutcome(em, run, outcome);
  if (actor) await recordAudit(em, actor, 'run.reprocess', 'run', run.id, { changes: changes.map((c) => ({ ...c })) });
  return changes;
}

export async function reprocessRunById(em: EntityManager, deps: AppDeps, actor: Actor, id: string): Promise<RunDetailDto & { changes: ReanalysisChange[] }> {
  const run = await getRunEntity(em, actor, id, { includeDeleted: false, curve: true });
  const changes = await reprocessRun(em, deps, actor, run);
  return { ...(await toRunDetail(em, run)), changes };
}

/** The original bytes of a run, as a stream from object storage. */
export async function rawFile(em: EntityManager, deps: AppDeps, actor: Actor, id: string) {
  const run = await getRunEntity(em, actor, id);
  const obj = await deps.storage.getStream(run.rawKey);
  return { run, obj };
}
