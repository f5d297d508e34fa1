/** Runs as the API answers them: the summary of a list row and the detail of one run. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { ApiErrorCode } from '@shared/errors';
import { bikeLabel } from '@shared/labels';
import type { CorrectionId, RunDetailDto, RunSummaryDto } from '@shared/schemas/run';
import type { Run } from './run.entity';
import { Stage } from '../stages/stage.entity';

/** Relations a summary reads. */
export const RUN_POPULATE = ['bike', 'bike.customer', 'stage', 'session'] as const;

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
    bikeLabel: bikeLabel(r.bike),
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
    error: r.error ? { code: r.error.code as ApiErrorCode, message: r.error.message } : null,
    tags: r.tags ?? [],
    note: r.note,
    isReference: refs.has(r.id),
    pullIndex: r.pullIndex,
    pullCount: r.pullCount,
    review: (r.warnings ?? []).some((w) => w.code === 'GLITCHES_REVIEW'),
    createdAt: r.createdAt.toISOString(),
    deletedAt: r.deletedAt ? r.deletedAt.toISOString() : null,
  };
}

/** Summaries of runs, with the reference flags looked up in one query. */
export async function toRunSummaries(em: EntityManager, runs: Run[]): Promise<RunSummaryDto[]> {
  const refs = await referenceRunIds(em, runs.map((r) => r.id));
  return runs.map((r) => toRunSummary(r, refs));
}

export async function runSummaryOf(em: EntityManager, run: Run): Promise<RunSummaryDto> {
  await em.populate(run, RUN_POPULATE as never);
  return (await toRunSummaries(em, [run]))[0];
}

interface StoredMappingHelp {
  headers?: string[];
  previewRows?: string[][];
  suggestions?: Record<string, unknown>;
  speedColumn?: string;
  rpmPerSpeedHint?: string;
}

/** Run → detail DTO (summary, curve, conditions, mapping help while it waits for a mapping). */
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
    pullTimeS: run.pullStartS !== null && run.pullEndS !== null ? [run.pullStartS, run.pullEndS] : null,
    pullRows: run.pullFirstRow !== null && run.pullLastRow !== null ? [run.pullFirstRow, run.pullLastRow] : null,
    rpmPerSpeed: run.rpmPerSpeed ? { ...run.rpmPerSpeed } : null,
    uploadedByName: run.uploadedBy?.name ?? null,
    dynoName: run.session?.dyno?.name ?? null,
    mappingHelp: help && Array.isArray(help.headers)
      ? {
          headers: help.headers,
          previewRows: help.previewRows ?? [],
          suggestions: help.suggestions ?? {},
          ...(typeof help.speedColumn === 'string' ? { speedColumn: help.speedColumn, rpmPerSpeedHint: help.rpmPerSpeedHint } : {}),
        }
      : null,
  };
}
