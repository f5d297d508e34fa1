/**
 * The upload pipeline, shared by the API, the import and reprocess command lines and the demo
 * archive: hash → duplicate check → raw bytes to object storage FIRST → analysis → one database
 * transaction. A file that fails analysis is still stored and listed ("nothing is lost").
 */
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import type { EntityManager } from '@mikro-orm/postgresql';
import { UniqueConstraintViolationException } from '@mikro-orm/core';
import type { AppDeps } from '../../app-deps';
import type { Actor } from '../../http/actor';
import { AppError, conflict, notFound } from '../../lib/errors';
import { discardObject } from '../../lib/storage/discard-object';
import {
  AnalysisError,
  analyzeBuffer,
  correctionFactor,
  isCorrectionStandard,
  type AnalysisResult,
  type AnalyzeOptions,
  type ColumnMapping,
  type CorrectionStandard,
} from '@shared/analysis/index';
import { analyzeFile } from '../../lib/run-files/index';
import type { UploadResult } from '@shared/schemas/run';
import { Run, ColumnLayout, type RunStatus } from './run.entity';
import { Bike } from '../bikes/bike.entity';
import { Shop } from '../shops/shop.entity';
import { Stage } from '../stages/stage.entity';
import { User } from '../users/user.entity';
import { DynoSession } from '../sessions/dyno-session.entity';
import { recordAudit } from '../audit/audit.service';
import { RUN_POPULATE, toRunSummaries } from './run.service';

/**
 * A file to ingest: either bytes in memory (demo archive, small callers) or a file on disk (the
 * upload route's temporary files, the import command's folder). Files on disk are never read
 * into memory whole: hashed and stored as streams, analysed with the streaming reader.
 */
export type IncomingFile = { originalName: string; contentType: string | null } & ({ bytes: Buffer; path?: undefined } | { path: string; bytes?: undefined });

/** What the analysis reads: bytes in memory or a file on disk. */
export type RunSource = Uint8Array | { path: string };

export interface IngestTarget {
  bikeId: string;
  sessionId?: string | null;
  stageId?: string | null;
}

/** Analysis codes that carry mapping help: the run waits for a hand mapping. */
const MAPPING_CODES = new Set(['NEEDS_MAPPING', 'NO_RPM_COLUMN', 'NO_POWER_OR_TORQUE']);

export const sha256Hex = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

/** SHA-256 of a file on disk, streamed (constant memory). */
export async function sha256File(file: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of fs.createReadStream(file)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}
export const rawKeyFor = (shopId: string, bikeId: string, sha256: string) => `shops/${shopId}/bikes/${bikeId}/${sha256}`;

/** What one analysis attempt produced, ready to be written onto a Run. */
export interface AnalysisOutcome {
  status: RunStatus;
  result: AnalysisResult | null;
  error: { code: string; message: string; details?: unknown } | null;
  mapping: ColumnMapping | null;
  headerSignature: string | null;
  correction: CorrectionStandard;
  conditions: Record<string, unknown>;
}

/** Conditions and correction standard for a run: the session's, else the shop's default standard. */
export function analysisContext(session: DynoSession | null, shop: Shop | null): { correction: CorrectionStandard; conditions: AnalyzeOptions['conditions'] } {
  const wanted = session?.correctionStandard ?? shop?.defaultCorrection ?? 'sae-j1349';
  const correction: CorrectionStandard = isCorrectionStandard(wanted) ? wanted : 'sae-j1349';
  const conditions: NonNullable<AnalyzeOptions['conditions']> = {};
  if (session?.ambientTempC != null) conditions.temperatureC = session.ambientTempC;
  if (session?.baroKpa != null) conditions.baroKpa = session.baroKpa;
  if (session?.humidityPct != null) conditions.humidityPct = session.humidityPct;
  return { correction, conditions };
}

function errorOf(e: unknown): { code: string; message: string; details?: unknown } {
  if (e instanceof AnalysisError) {
    const details = e.details ?? (e.line !== undefined || e.column !== undefined ? { line: e.line, column: e.column } : undefined);
    return { code: e.code, message: e.message, ...(details !== undefined ? { details } : {}) };
  }
  return { code: 'READ_FAILED', message: 'The file could not be read.' };
}

/**
 * One pass of the engine, uncorrected; the correction is applied here afterwards, so a file with
 * no known conditions (no session, nothing in its preamble) is read once, not twice.
 */
async function analyseOnce(source: RunSource, correction: CorrectionStandard, conditions: AnalyzeOptions['conditions'], mapping: ColumnMapping | null): Promise<AnalysisResult> {
  const options: AnalyzeOptions = { correction: 'none', conditions, ...(mapping ? { mapping } : {}) };
  // analyzeFile streams the file (memory bounded by the used columns, not the file) and gives
  // the same result as analyzeBuffer (tests/unit/analysis/stream.test.ts checks that).
  const result = source instanceof Uint8Array ? analyzeBuffer(source, options) : await analyzeFile(source.path, options);
  if (correction === 'none') return result;
  let factor: number;
  try {
    factor = correctionFactor(correction, result.conditions);
  } catch (e) {
    if (!(e instanceof AnalysisError && e.code === 'CONDITIONS_MISSING')) throw e;
    result.warnings.push({
      code: 'UNCORRECTED',
      message: `No ambient temperature and pressure were known (no session conditions, none in the file), so ${correction} correction could not be applied; figures are uncorrected. Put the run in a session with its conditions and re-process it.`,
    });
    return result;
  }
  if (correction !== 'din-70020' && typeof result.conditions.humidityPct !== 'number') {
    result.warnings.push({ code: 'HUMIDITY_ASSUMED_DRY', message: 'No relative humidity was given; dry air (0 %) was assumed for the correction.' });
  }
  result.correction = { standard: correction, factor };
  result.peakPower = { hp: result.peakPower.hp * factor, rpm: result.peakPower.rpm };
  result.peakTorque = { lbft: result.peakTorque.lbft * factor, rpm: result.peakTorque.rpm };
  return result;
}

/**
 * Analyse a run file (bytes or a file on disk). Mapping precedence: the explicit one, then a saved
 * column layout whose header signature matches, then automatic recognition.
 */
export async function analyseRun(
  source: RunSource,
  ctx: { correction: CorrectionStandard; conditions: AnalyzeOptions['conditions'] },
  layouts: Map<string, ColumnMapping>,
  explicit: ColumnMapping | null = null,
): Promise<AnalysisOutcome> {
  const base = { correction: ctx.correction, conditions: { ...(ctx.conditions ?? {}) } };
  const attempt = async (mapping: ColumnMapping | null): Promise<AnalysisOutcome> => {
    try {
      const result = await analyseOnce(source, ctx.correction, ctx.conditions, mapping);
      return { ...base, status: 'ready', result, error: null, mapping, headerSignature: result.headerSignature, correction: result.correction.standard, conditions: result.conditions };
    } catch (e) {
      const error = errorOf(e);
      const help = error.details as { headerSignature?: string } | undefined;
      const status: RunStatus = MAPPING_CODES.has(error.code) ? 'needs-mapping' : 'failed';
      return { ...base, status, result: null, error, mapping, headerSignature: typeof help?.headerSignature === 'string' ? help.headerSignature : null };
    }
  };
  if (explicit) return attempt(explicit);
  const first = await attempt(null);
  const saved = first.headerSignature ? layouts.get(first.headerSignature) : undefined;
  if (!saved) return first;
  const withLayout = await attempt(saved);
  // A saved layout that no longer fits this file must not hide a good automatic reading.
  return withLayout.status === 'ready' || first.status !== 'ready' ? withLayout : first;
}

/** Copy an analysis outcome onto a run (summary columns, curve, error). */
export function applyOutcome(run: Run, o: AnalysisOutcome) {
  const r = o.result;
  run.status = o.status;
  run.error = o.error;
  run.mapping = o.mapping ? { ...o.mapping } : null;
  run.headerSignature = o.headerSignature;
  run.curve = r ? r.curve : null;
  run.peakPowerHp = r ? r.peakPower.hp : null;
  run.peakPowerRpm = r ? r.peakPower.rpm : null;
  run.peakTorqueLbft = r ? r.peakTorque.lbft : null;
  run.peakTorqueRpm = r ? r.peakTorque.rpm : null;
  run.rpmMin = r ? r.rpmRange[0] : null;
  run.rpmMax = r ? r.rpmRange[1] : null;
  run.points = r ? r.points : null;
  run.identityStatus = r ? r.identity.status : null;
  run.maxDeviationPct = r ? r.identity.maxDeviationPct : null;
  run.correctionStandard = r ? r.correction.standard : o.correction;
  run.correctionFactor = r ? r.correction.factor : null;
  run.conditions = o.conditions;
  run.columns = r ? { ...r.columns, units: r.units, confidence: r.confidence, droppedPoints: r.droppedPoints } : null;
  run.warnings = r ? r.warnings : [];
}

export async function shopLayouts(em: EntityManager, shopId: string): Promise<Map<string, ColumnMapping>> {
  const rows = await em.find(ColumnLayout, { shop: shopId });
  return new Map(rows.map((l) => [l.headerSignature, l.mapping as ColumnMapping]));
}

/** Loads and checks the upload target: bike of the shop, session of that bike (safety confirmed), stage of that bike. */
export async function loadTarget(em: EntityManager, actor: Actor, target: IngestTarget) {
  const bike = await em.findOne(Bike, { id: target.bikeId, shop: actor.shopId }, { populate: ['customer', 'shop'] });
  if (!bike) throw notFound('Bike');
  let session: DynoSession | null = null;
  if (target.sessionId) {
    session = await em.findOne(DynoSession, { id: target.sessionId, shop: actor.shopId });
    if (!session) throw notFound('Session');
    if (session.bike.id !== bike.id) throw new AppError('SESSION_OTHER_BIKE', 'That session belongs to another bike', 400);
    if (!session.safetyConfirmedAt) {
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

async function nextSequence(em: EntityManager, bikeId: string, sessionId: string | null): Promise<number> {
  const conn = em.getConnection();
  // Serialise sequence numbers per bike inside the transaction.
  await conn.execute(`select pg_advisory_xact_lock(hashtextextended(?, 0))`, [`run-seq:${bikeId}`], 'all', em.getTransactionContext());
  const rows = (await conn.execute(
    sessionId ? `select coalesce(max(sequence), 0) + 1 as n from run where session_id = ?` : `select coalesce(max(sequence), 0) + 1 as n from run where bike_id = ? and session_id is null`,
    [sessionId ?? bikeId],
    'all',
    em.getTransactionContext(),
  )) as { n: number | string }[];
  return Number(rows[0]?.n ?? 1);
}

const resultOfError = (file: string, error: { code: string; message: string; details?: unknown }, runId?: string): UploadResult => ({ file, ok: false, error, ...(runId ? { runId } : {}) });

/**
 * Ingest files for one bike (and optionally a session and a stage). Answers one result per file,
 * in order. Throws 503 STORAGE_UNAVAILABLE, writing nothing, when storage cannot be reached.
 */
export async function ingestFiles(em: EntityManager, deps: AppDeps, actor: Actor, target: IngestTarget, files: IncomingFile[]): Promise<UploadResult[]> {
  const { bike, session, stage } = await loadTarget(em, actor, target);
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
  for (const f of files) hashes.push(f.path !== undefined ? await sha256File(f.path) : sha256Hex(f.bytes));
  const existing = await em.find(Run, { bike: bike.id, rawSha256: { $in: [...new Set(hashes)] } }, { fields: ['id', 'rawSha256', 'deletedAt'] });
  const known = new Map(existing.map((r) => [r.rawSha256, r.id]));

  type Pending = { kind: 'run'; file: string; runId: string; duplicate: boolean } | { kind: 'done'; result: UploadResult };
  const pending: Pending[] = [];
  let stored = 0;
  for (let i = 0; i < files.length; i++) {
    const f = files[i];
    const sha = hashes[i];
    const dupId = known.get(sha);
    if (dupId) {
      pending.push({ kind: 'run', file: f.originalName, runId: dupId, duplicate: true });
      continue;
    }
    const key = rawKeyFor(actor.shopId, bike.id, sha);
    let size: number;
    try {
      // A file on disk goes up as a stream (lib-storage's Upload, multipart above its part size).
      size = f.path !== undefined ? (await fs.promises.stat(f.path)).size : f.bytes.length;
      const body = f.path !== undefined ? fs.createReadStream(f.path) : f.bytes;
      try {
        await deps.storage.put(key, body, { contentType: f.contentType ?? 'application/octet-stream' });
      } finally {
        if (body instanceof fs.ReadStream) body.destroy(); // a failed put may leave it open
      }
    } catch (err) {
      if (stored === 0) throw err; // nothing written yet: the whole request answers 503
      const e = err instanceof AppError ? err : new AppError('STORAGE_UNAVAILABLE', 'File storage failed', 503);
      pending.push({ kind: 'done', result: resultOfError(f.originalName, { code: e.code, message: e.message }) });
      continue;
    }
    const outcome = await analyseRun(f.path !== undefined ? { path: f.path } : f.bytes, ctx, layouts);
    try {
      const runId = await em.transactional(async (tem) => {
        const run = tem.create(Run, {
          shop: tem.getReference(Shop, actor.shopId),
          bike: tem.getReference(Bike, bike.id),
          session: session ? tem.getReference(DynoSession, session.id) : null,
          stage: stage ? tem.getReference(Stage, stage.id) : null,
          sequence: await nextSequence(tem, bike.id, session?.id ?? null),
          rawKey: key,
          rawSha256: sha,
          rawSizeBytes: size,
          originalName: f.originalName,
          contentType: f.contentType,
          uploadedBy: tem.getReference(User, actor.id),
          tags: [],
        } as unknown as Run);
        applyOutcome(run, outcome);
        await tem.flush();
        await recordAudit(tem, actor, 'run.upload', 'run', run.id, { file: f.originalName, sha256: sha, status: run.status, bikeId: bike.id, sessionId: session?.id ?? null });
        return run.id;
      });
      stored++;
      known.set(sha, runId);
      if (outcome.status === 'ready') pending.push({ kind: 'run', file: f.originalName, runId, duplicate: false });
      else pending.push({ kind: 'done', result: resultOfError(f.originalName, outcome.error!, runId) });
    } catch (err) {
      if (err instanceof UniqueConstraintViolationException) {
        // The same file arrived at the same moment in another request: it is in the archive.
        const other = await em.fork().findOne(Run, { bike: bike.id, rawSha256: sha });
        if (other) {
          known.set(sha, other.id);
          pending.push({ kind: 'run', file: f.originalName, runId: other.id, duplicate: true });
          continue;
        }
      }
      const why = (err instanceof Error ? err.message : String(err)).split(' - ').pop()!.slice(0, 300);
      const fate = await discardObject(deps, key, `run row for ${f.originalName} did not commit: ${why}`);
      console.error(`[pullbook] saving run ${f.originalName} failed (object ${fate}): ${why}`);
      pending.push({ kind: 'done', result: resultOfError(f.originalName, { code: 'SAVE_FAILED', message: 'The file could not be saved in the archive; nothing was kept. Try again.' }) });
    }
  }

  const ids = [...new Set(pending.flatMap((p) => (p.kind === 'run' ? [p.runId] : [])))];
  const runs = ids.length ? await em.fork().find(Run, { id: { $in: ids } }, { populate: RUN_POPULATE as never }) : [];
  const summaries = new Map((await toRunSummaries(em, runs)).map((s) => [s.id, s]));
  return pending.map((p): UploadResult => {
    if (p.kind === 'done') return p.result;
    const run = summaries.get(p.runId)!;
    if (!p.duplicate && run.status !== 'ready') return resultOfError(p.file, run.error ?? { code: 'FAILED', message: 'Analysis failed' }, run.id);
    return p.duplicate
      ? ({ file: p.file, ok: true, duplicate: true, run, message: `Already in the archive${run.deletedAt ? ' (as a deleted run; the owner can restore it)' : ''}: ${run.originalName}; nothing new was saved.` } as UploadResult)
      : { file: p.file, ok: true, run };
  });
}

export interface ReanalysisChange {
  field: string;
  before: unknown;
  after: unknown;
}

const round = (v: number | null, d: number) => (v === null ? null : Number(v.toFixed(d)));

function snapshot(run: Run) {
  return {
    status: run.status,
    peakPowerHp: round(run.peakPowerHp, 2),
    peakPowerRpm: run.peakPowerRpm,
    peakTorqueLbft: round(run.peakTorqueLbft, 2),
    peakTorqueRpm: run.peakTorqueRpm,
    rpmMin: run.rpmMin,
    rpmMax: run.rpmMax,
    identityStatus: run.identityStatus,
    correctionStandard: run.correctionStandard,
    correctionFactor: round(run.correctionFactor, 4),
    warnings: (run.warnings ?? []).map((w) => w.code).join(',') || '-',
    error: run.error?.code ?? '-',
  };
}

/**
 * Re-derive a run from its raw file (after an analysis change, a new mapping or new session
 * conditions). With `mapping`, that mapping is used; otherwise the run's own, a saved layout,
 * or recognition. Returns the outcome without touching the run when `dryRun`.
 */
export async function reanalyseRun(em: EntityManager, deps: AppDeps, run: Run, opts: { mapping?: ColumnMapping | null } = {}): Promise<{ outcome: AnalysisOutcome; changes: ReanalysisChange[] }> {
  await em.populate(run, ['session', 'shop', 'curve'] as never);
  const bytes = await deps.storage.getBuffer(run.rawKey);
  if (sha256Hex(bytes) !== run.rawSha256) throw new AppError('RAW_MISMATCH', 'The stored file does not match its recorded SHA-256; it was not re-processed.', 500);
  const layouts = await shopLayouts(em, run.shop.id);
  const ctx = analysisContext(run.session, run.shop);
  const explicit = opts.mapping !== undefined ? opts.mapping : ((run.mapping as ColumnMapping | null) ?? null);
  const outcome = await analyseRun(bytes, ctx, layouts, explicit);
  const before = snapshot(run);
  const probe = new Run();
  applyOutcome(probe, outcome);
  const after = snapshot(probe);
  const changes = (Object.keys(before) as (keyof typeof before)[]).filter((k) => before[k] !== after[k]).map((k) => ({ field: k, before: before[k], after: after[k] }));
  return { outcome, changes };
}
