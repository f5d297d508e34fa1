import type { EntityManager } from '@mikro-orm/postgresql';
import type { FilterQuery } from '@mikro-orm/core';
import type { z } from 'zod';
import type { Actor } from '../../http/actor';
import { AppError, notFound } from '../../lib/errors';
import { parseSort, type Page } from '@shared/schemas/common';
import type { CorrectionId, RunDetailDto, RunSummaryDto, runListQuery, runUpdateInput } from '@shared/schemas/run';
import { Run, ColumnLayout } from './run.entity';
import { Stage } from '../stages/stage.entity';
import { recordAudit } from '../audit/audit.service';
import { refreshBikeOutcomes } from '../builds/build-outcome.service';

export type RunListQuery = z.output<typeof runListQuery>;
export type RunUpdateInput = z.output<typeof runUpdateInput>;

const NO_CUSTOMER = '00000000-0000-0000-0000-000000000000';

/** Shop scope plus, for customers, their own bikes only; deleted runs only when asked for. */
export function runScope(actor: Actor, opts: { includeDeleted?: boolean } = {}): FilterQuery<Run> {
  const where: Record<string, unknown> = { shop: actor.shopId };
  if (actor.role === 'customer') where.bike = { customer: actor.customerId ?? NO_CUSTOMER };
  if (!opts.includeDeleted || actor.role === 'customer') where.deletedAt = null;
  return where as FilterQuery<Run>;
}

export const bikeLabelOf = (b: { year: number | null; make: string; model: string }) => [b.year, b.make, b.model].filter((x) => x !== null && x !== '').join(' ');

/** Ids of runs that are some stage's reference run. */
export async function referenceRunIds(em: EntityManager, runIds: string[]): Promise<Set<string>> {
  if (!runIds.length) return new Set();
  const stages = await em.find(Stage, { referenceRun: { $in: runIds } }, { fields: ['id', 'referenceRun'] });
  return new Set(stages.map((s) => s.referenceRun!.id));
}

/** Run → summary DTO. Needs bike, bike.customer and stage populated. */
export function toRunSummary(r: Run, refs: Set<string>): RunSummaryDto {
  return {
    id: r.id,
    bikeId: r.bike.id,
    bikeLabel: bikeLabelOf(r.bike),
    customerName: r.bike.customer?.name ?? '',
    sessionId: r.session?.id ?? null,
    stageId: r.stage?.id ?? null,
    stageName: r.stage?.name ?? null,
    label: r.label,
    sequence: r.sequence,
    originalName: r.originalName,
    status: r.status,
    peakPowerHp: r.peakPowerHp,
    peakPowerRpm: r.peakPowerRpm,
    peakTorqueLbft: r.peakTorqueLbft,
    peakTorqueRpm: r.peakTorqueRpm,
    rpmMin: r.rpmMin,
    rpmMax: r.rpmMax,
    identityStatus: r.identityStatus as RunSummaryDto['identityStatus'],
    correctionStandard: r.correctionStandard as CorrectionId | null,
    correctionFactor: r.correctionFactor,
    warnings: r.warnings ?? [],
    error: r.error ? { code: r.error.code, message: r.error.message } : null,
    tags: r.tags ?? [],
    note: r.note,
    isReference: refs.has(r.id),
    createdAt: r.createdAt.toISOString(),
    deletedAt: r.deletedAt ? r.deletedAt.toISOString() : null,
  };
}

export const RUN_POPULATE = ['bike', 'bike.customer', 'stage', 'session'] as const;

/** Summaries of runs, with the reference flags looked up in one query. */
export async function toRunSummaries(em: EntityManager, runs: Run[]): Promise<RunSummaryDto[]> {
  const refs = await referenceRunIds(em, runs.map((r) => r.id));
  return runs.map((r) => toRunSummary(r, refs));
}

export async function runSummaryOf(em: EntityManager, run: Run): Promise<RunSummaryDto> {
  await em.populate(run, RUN_POPULATE as never);
  return (await toRunSummaries(em, [run]))[0];
}

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

export async function listRuns(em: EntityManager, actor: Actor, query: RunListQuery): Promise<Page<RunSummaryDto>> {
  const where = { ...(runScope(actor, { includeDeleted: query.includeDeleted && actor.role === 'owner' }) as Record<string, unknown>) };
  const and: Record<string, unknown>[] = [];
  if (query.bikeId) and.push({ bike: query.bikeId });
  if (query.customerId) and.push({ bike: { customer: query.customerId } });
  if (query.stageId) and.push({ stage: query.stageId });
  if (query.sessionId) and.push({ session: query.sessionId });
  if (query.status) and.push({ status: query.status });
  if (query.tag) and.push({ tags: { $contains: [query.tag] } });
  if (query.from) and.push({ createdAt: { $gte: new Date(`${query.from}T00:00:00Z`) } });
  if (query.to) and.push({ createdAt: { $lt: new Date(new Date(`${query.to}T00:00:00Z`).getTime() + 86_400_000) } });
  if (query.q) {
    const like = `%${escapeLike(query.q)}%`;
    and.push({
      $or: [
        { originalName: { $ilike: like } },
        { label: { $ilike: like } },
        { note: { $ilike: like } },
        { bike: { make: { $ilike: like } } },
        { bike: { model: { $ilike: like } } },
        { bike: { customer: { name: { $ilike: like } } } },
        { stage: { name: { $ilike: like } } },
      ],
    });
  }
  if (and.length) where.$and = and;
  const { field, dir } = parseSort(query.sort, '-createdAt');
  const order = field === 'createdAt' ? dir : (`${dir} nulls last` as const);
  const [rows, total] = await em.findAndCount(Run, where as FilterQuery<Run>, {
    populate: RUN_POPULATE as never,
    orderBy: [{ [field]: order }, { createdAt: 'desc' }, { id: 'asc' }],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
  });
  return { items: await toRunSummaries(em, rows), total, page: query.page, pageSize: query.pageSize };
}

/** A run the actor may see, or 404 (never 403). Owners also reach deleted runs (to restore them). */
export async function getRunEntity(em: EntityManager, actor: Actor, id: string, opts: { includeDeleted?: boolean; curve?: boolean } = {}): Promise<Run> {
  const includeDeleted = opts.includeDeleted ?? actor.role === 'owner';
  const populate = [...RUN_POPULATE, 'session.dyno', 'uploadedBy', ...(opts.curve ? ['curve'] : [])];
  const run = await em.findOne(Run, { ...(runScope(actor, { includeDeleted }) as object), id } as FilterQuery<Run>, { populate: populate as never });
  if (!run) throw notFound('Run');
  return run;
}

interface StoredMappingHelp {
  headers?: string[];
  previewRows?: string[][];
  suggestions?: Record<string, unknown>;
}

export async function runDetail(em: EntityManager, actor: Actor, id: string): Promise<RunDetailDto> {
  const run = await getRunEntity(em, actor, id, { curve: true });
  return toRunDetail(em, run);
}

export async function toRunDetail(em: EntityManager, run: Run): Promise<RunDetailDto> {
  await em.populate(run, [...RUN_POPULATE, 'session.dyno', 'uploadedBy', 'curve'] as never);
  const summary = (await toRunSummaries(em, [run]))[0];
  const help = run.status === 'needs-mapping' ? ((run.error?.details ?? null) as StoredMappingHelp | null) : null;
  return {
    ...summary,
    curve: run.curve ?? null,
    conditions: run.conditions as RunDetailDto['conditions'],
    columns: run.columns,
    mapping: run.mapping,
    rawSizeBytes: run.rawSizeBytes,
    rawSha256: run.rawSha256,
    uploadedByName: run.uploadedBy?.name ?? null,
    dynoName: run.session?.dyno?.name ?? null,
    mappingHelp: help && Array.isArray(help.headers) ? { headers: help.headers, previewRows: help.previewRows ?? [], suggestions: help.suggestions ?? {} } : null,
  };
}

/** A stage of the same bike, or 404. */
export async function stageOfBike(em: EntityManager, actor: Actor, stageId: string, bikeId: string): Promise<Stage> {
  const stage = await em.findOne(Stage, { id: stageId, shop: actor.shopId, bike: bikeId });
  if (!stage) throw notFound('Stage');
  return stage;
}

export async function updateRun(em: EntityManager, actor: Actor, id: string, input: RunUpdateInput): Promise<RunDetailDto> {
  const run = await getRunEntity(em, actor, id, { includeDeleted: false });
  const changes: Record<string, unknown> = {};
  let outcomesChanged = false;
  if (input.stageId !== undefined && (input.stageId ?? null) !== (run.stage?.id ?? null)) {
    const previous = run.stage;
    run.stage = input.stageId ? await stageOfBike(em, actor, input.stageId, run.bike.id) : null;
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
  await em.flush();
  if (outcomesChanged) await refreshBikeOutcomes(em, run.bike.id);
  await recordAudit(em, actor, 'run.update', 'run', run.id, changes);
  return toRunDetail(em, run);
}

export async function deleteRun(em: EntityManager, actor: Actor, id: string): Promise<RunSummaryDto> {
  const run = await getRunEntity(em, actor, id, { includeDeleted: false });
  run.deletedAt = new Date();
  // A deleted run cannot represent a stage any more.
  const stages = await em.find(Stage, { referenceRun: run.id });
  for (const s of stages) s.referenceRun = null;
  await em.flush();
  if (stages.length) await refreshBikeOutcomes(em, run.bike.id);
  await recordAudit(em, actor, 'run.delete', 'run', run.id, { originalName: run.originalName, wasReferenceOf: stages.map((s) => s.id) });
  return runSummaryOf(em, run);
}

export async function restoreRun(em: EntityManager, actor: Actor, id: string): Promise<RunSummaryDto> {
  const run = await getRunEntity(em, actor, id, { includeDeleted: true });
  if (!run.deletedAt) throw new AppError('NOT_DELETED', 'This run is not deleted', 409);
  run.deletedAt = null;
  await em.flush();
  await recordAudit(em, actor, 'run.restore', 'run', run.id, { originalName: run.originalName });
  return runSummaryOf(em, run);
}

// ---- column layouts

export interface ColumnLayoutDto {
  id: string;
  name: string;
  headerSignature: string;
  mapping: Record<string, unknown>;
  createdAt: string;
}

const toLayoutDto = (l: ColumnLayout): ColumnLayoutDto => ({ id: l.id, name: l.name, headerSignature: l.headerSignature, mapping: l.mapping, createdAt: l.createdAt.toISOString() });

export async function listLayouts(em: EntityManager, actor: Actor): Promise<ColumnLayoutDto[]> {
  return (await em.find(ColumnLayout, { shop: actor.shopId }, { orderBy: { name: 'asc', id: 'asc' } })).map(toLayoutDto);
}

export async function deleteLayout(em: EntityManager, actor: Actor, id: string): Promise<void> {
  const layout = await em.findOne(ColumnLayout, { id, shop: actor.shopId });
  if (!layout) throw notFound('Column layout');
  await em.removeAndFlush(layout);
  await recordAudit(em, actor, 'column-layout.delete', 'column-layout', id, { name: layout.name });
}
