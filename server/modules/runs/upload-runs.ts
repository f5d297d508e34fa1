/**
 * The upload pipeline, shared by the API, the import command line and the demo archive:
 * streamed SHA-256 → duplicate check per bike → raw bytes to object storage FIRST → analysis →
 * one database transaction per file (its runs and their audit lines). A file that fails analysis
 * is still stored and listed ("nothing is lost").
 *
 * One analysed file gives a list of outcomes (`analyseUpload`), one per pull of the log, and each
 * outcome becomes a run pointing at the same stored raw file (`pullIndex`). The duplicate check is
 * per bike on the file's SHA-256: a file uploaded again answers every run it already made.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { UniqueConstraintViolationException } from '@mikro-orm/core';
import type { AppDeps } from '../../app-deps';
import type { Actor } from '../../http/actor';
import { AppError, conflict, notFound } from '../../lib/errors';
import { discardObject } from '../../lib/storage/discard-object';
import type { RunFileError, RunSummaryDto, UploadResult } from '@shared/schemas/run';
import { Run } from './run.entity';
import { Bike } from '../bikes/bike.entity';
import { Shop } from '../shops/shop.entity';
import { Stage } from '../stages/stage.entity';
import { User } from '../users/user.entity';
import { DynoSession } from '../sessions/dyno-session.entity';
import { recordAudit } from '../audit/audit.service';
import { RUN_POPULATE, toRunSummaries } from './run-dto';
import { putRawFile, rawKeyFor, sha256Of, type IncomingFile } from './raw-store';
import { analyseUpload, analysisContext, shopLayouts, type AnalysisOutcome } from './run-analysis';
import { applyOutcome } from './run-outcome';
import { nextSequence } from './run-sequence';
import { logger } from '../../lib/logger';

export type { IncomingFile } from './raw-store';

export interface IngestTarget {
  bikeId: string;
  sessionId?: string | null;
  stageId?: string | null;
}

/**
 * How files arrive. `via`: said in the audit lines (e.g. the sync agent's token). `requireSafety`:
 * false for files the dyno already recorded (the bay board shows the unconfirmed checklist
 * instead): refusing them would only lose the pull.
 */
export interface IngestOptions {
  via?: string;
  requireSafety?: boolean;
}

type Target = Awaited<ReturnType<typeof loadTarget>>;

/** Loads and checks the upload target: bike of the shop, session of that bike (safety confirmed), stage of that bike. */
export async function loadTarget(em: EntityManager, actor: Actor, target: IngestTarget, opts: IngestOptions = {}) {
  const bike = await em.findOne(Bike, { id: target.bikeId, shop: actor.shopId }, { populate: ['customer', 'shop'] });
  if (!bike) throw notFound('Bike');
  let session: DynoSession | null = null;
  if (target.sessionId) {
    session = await em.findOne(DynoSession, { id: target.sessionId, shop: actor.shopId });
    if (!session) throw notFound('Session');
    if (session.bike.id !== bike.id) throw new AppError('SESSION_OTHER_BIKE', 'That session belongs to another bike', 400);
    if (!session.safetyConfirmedAt && opts.requireSafety !== false) {
      throw conflict('SAFETY_CHECK_REQUIRED', 'Confirm the dyno-bay safety checklist for this session before the first upload (restraints, cooling fan, extraction, hearing protection, nobody in line with the roller, extinguisher at hand).', { sessionId: session.id });
    }
  }
  let stage: Stage | null = null;
  if (target.stageId) {
    stage = await em.findOne(Stage, { id: target.stageId, shop: actor.shopId, bike: bike.id });
    if (!stage) throw notFound('Stage');
  }
  return { bike, session, stage };
}

/** The stored raw file that the runs of one upload point at. */
interface StoredFile {
  file: IncomingFile;
  key: string;
  sha256: string;
  size: number;
}

/**
 * Saves one run per outcome of a stored file, with their audit lines, in one transaction.
 * Answers the run ids in outcome order.
 */
async function saveRuns(em: EntityManager, actor: Actor, { bike, session, stage }: Target, stored: StoredFile, outcomes: AnalysisOutcome[], via?: string): Promise<string[]> {
  return em.transactional(async (tem) => {
    const ids: string[] = [];
    for (const outcome of outcomes) {
      const run = tem.create(Run, {
        shop: tem.getReference(Shop, actor.shopId),
        bike: tem.getReference(Bike, bike.id),
        session: session ? tem.getReference(DynoSession, session.id) : null,
        stage: stage ? tem.getReference(Stage, stage.id) : null,
        sequence: await nextSequence(tem, bike.id, session?.id ?? null),
        pullIndex: outcome.pullIndex,
        rawKey: stored.key,
        rawSha256: stored.sha256,
        rawSizeBytes: stored.size,
        originalName: stored.file.originalName,
        contentType: stored.file.contentType,
        uploadedBy: tem.getReference(User, actor.id),
        tags: [],
      } as unknown as Run);
      applyOutcome(run, outcome);
      await tem.flush();
      await recordAudit(tem, actor, 'run.upload', 'run', run.id, { file: stored.file.originalName, sha256: stored.sha256, status: run.status, bikeId: bike.id, sessionId: session?.id ?? null, pull: run.pullIndex + 1, pulls: run.pullCount, ...(via ? { via } : {}) });
      ids.push(run.id);
    }
    return ids;
  });
}

/** Per file, before the summaries are read: the runs to answer with, or a finished result. */
/** `error`: for a fresh file none of whose pulls could be read, the reader's error with its details (mapping help). */
type Pending = { kind: 'runs'; file: string; runIds: string[]; duplicate: boolean; error?: RunFileError } | { kind: 'done'; result: UploadResult };

const resultOfError = (file: string, error: RunFileError, runId?: string): UploadResult => ({ file, ok: false, error, ...(runId ? { runId } : {}) });

/**
 * Ingest files for one bike (and optionally a session and a stage). Answers one result per file,
 * in order. Throws 503 STORAGE_UNAVAILABLE, writing nothing, when storage cannot be reached.
 */
export async function ingestFiles(em: EntityManager, deps: AppDeps, actor: Actor, target: IngestTarget, files: IncomingFile[], opts: IngestOptions = {}): Promise<UploadResult[]> {
  const loaded = await loadTarget(em, actor, target, opts);
  const { bike, session } = loaded;
  if (!files.length) throw new AppError('NO_FILES', 'Add at least one run file (field "files")', 400);
  try {
    await deps.storage.ping();
  } catch (err) {
    throw new AppError('STORAGE_UNAVAILABLE', 'File storage is not reachable right now; nothing was saved. Try again shortly.', 503, { cause: err instanceof Error ? err.name : String(err) });
  }
  const ctx = analysisContext(session, bike.shop);
  const layouts = await shopLayouts(em, actor.shopId);
  // One pass over each file (streamed from disk for temporary files), for the duplicate check.
  const hashes: string[] = [];
  for (const f of files) hashes.push(await sha256Of(f));
  const existing = await em.find(Run, { bike: bike.id, rawSha256: { $in: [...new Set(hashes)] } }, { fields: ['id', 'rawSha256', 'pullIndex'], orderBy: { pullIndex: 'asc' } });
  const known = new Map<string, string[]>();
  for (const r of existing) known.set(r.rawSha256, [...(known.get(r.rawSha256) ?? []), r.id]);

  const pending: Pending[] = [];
  let stored = 0;
  for (let i = 0; i < files.length; i++) {
    const f = files[i];
    const sha = hashes[i];
    const dupIds = known.get(sha);
    if (dupIds) {
      pending.push({ kind: 'runs', file: f.originalName, runIds: dupIds, duplicate: true });
      continue;
    }
    const key = rawKeyFor(actor.shopId, bike.id, sha);
    let size: number;
    try {
      size = await putRawFile(deps, key, f);
    } catch (err) {
      if (stored === 0) throw err; // nothing written yet: the whole request answers 503
      const e = err instanceof AppError ? err : new AppError('STORAGE_UNAVAILABLE', 'File storage failed', 503);
      pending.push({ kind: 'done', result: resultOfError(f.originalName, { code: e.code, message: e.message }) });
      continue;
    }
    const outcomes = await analyseUpload(f.path !== undefined ? { path: f.path } : f.bytes, ctx, layouts);
    try {
      const runIds = await saveRuns(em, actor, loaded, { file: f, key, sha256: sha, size }, outcomes, opts.via);
      stored++;
      known.set(sha, runIds);
      const unread = outcomes.every((o) => o.status !== 'ready') ? outcomes[0].error ?? undefined : undefined;
      pending.push({ kind: 'runs', file: f.originalName, runIds, duplicate: false, ...(unread ? { error: unread } : {}) });
    } catch (err) {
      if (err instanceof UniqueConstraintViolationException) {
        // The same file arrived at the same moment in another request: it is in the archive.
        const others = await em.fork().find(Run, { bike: bike.id, rawSha256: sha }, { fields: ['id'], orderBy: { pullIndex: 'asc' } });
        if (others.length) {
          known.set(sha, others.map((o) => o.id));
          pending.push({ kind: 'runs', file: f.originalName, runIds: others.map((o) => o.id), duplicate: true });
          continue;
        }
      }
      const why = (err instanceof Error ? err.message : String(err)).split(' - ').pop()!.slice(0, 300);
      // The same content may be in the archive through another request's runs: never remove an object a run points at.
      const shared = (await em.fork().count(Run, { rawKey: key })) > 0;
      const fate = shared ? 'kept (other runs point at it)' : await discardObject(deps, key, `run row for ${f.originalName} did not commit: ${why}`);
      logger.error({ file: f.originalName, object: fate, reason: why }, 'saving an uploaded run failed');
      pending.push({ kind: 'done', result: resultOfError(f.originalName, { code: 'SAVE_FAILED', message: 'The file could not be saved in the archive; nothing was kept. Try again.' }) });
    }
  }
  return uploadResults(em, pending);
}

/** A file's result from its runs' summaries (in pull order): the first readable run answers for it. */
export function fileResult(file: string, runs: RunSummaryDto[], duplicate: boolean, error?: RunFileError): UploadResult {
  const pullCount = Math.max(runs.length, ...runs.map((r) => r.pullCount));
  const many = runs.length > 1 ? { pullCount, runs } : { pullCount };
  const ready = runs.find((r) => r.status === 'ready');
  if (duplicate) {
    const run = ready ?? runs[0];
    const deleted = runs.some((r) => r.deletedAt);
    const what = runs.length > 1 ? `${runs.length} runs from ${run.originalName}` : run.originalName;
    const archived = `Already in the archive${deleted ? ' (as a deleted run; the owner can restore it)' : ''}: ${what}; nothing new was saved.`;
    if (ready) return { file, ok: true, duplicate: true, run, ...many, message: archived };
    // The stored copy was never read: say so, and why, so the upload screen offers the mapping again.
    const why = run.error?.message ?? 'it could not be analysed';
    const next = run.status === 'needs-mapping' ? ' Choose its columns to read it.' : ' It stays in the archive and can be read again later.';
    return { file, ok: true, duplicate: true, run, ...many, message: `${archived} The stored copy could not be read: ${why}${/[.!?]$/.test(why) ? '' : '.'}${next}` };
  }
  if (ready) return { file, ok: true, run: ready, ...many };
  const [first] = runs;
  return { ...resultOfError(file, error ?? first.error ?? { code: 'FAILED', message: 'Analysis failed' }, first.id), ...many };
}

/** One result per file, with the summaries of the runs read in one query. */
async function uploadResults(em: EntityManager, pending: Pending[]): Promise<UploadResult[]> {
  const ids = [...new Set(pending.flatMap((p) => (p.kind === 'runs' ? p.runIds : [])))];
  const runs = ids.length ? await em.fork().find(Run, { id: { $in: ids } }, { populate: RUN_POPULATE as never }) : [];
  const summaries = new Map((await toRunSummaries(em, runs)).map((s) => [s.id, s]));
  return pending.map((p): UploadResult => (p.kind === 'done' ? p.result : fileResult(p.file, p.runIds.map((id) => summaries.get(id)!), p.duplicate, p.error)));
}
