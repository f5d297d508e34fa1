/**
 * Reading a run file with the engine: the correction standard and conditions that apply, the
 * shop's saved column layouts, and the outcome (ready, needs a mapping, or failed) of one file.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { ApiErrorCode } from '@shared/errors';
import {
  AnalysisError,
  analyzeBufferPulls,
  correctionFactor,
  isCorrectionStandard,
  type AnalysisPulls,
  type AnalysisResult,
  type AnalyzeOptions,
  type ColumnMapping,
  type CorrectionStandard,
  type RpmPerSpeed,
} from '@shared/analysis/index';
import { analyzeFilePulls } from '../../lib/run-files/index';
import { ColumnLayout, type RunStatus } from './run.entity';
import type { DynoSession } from '../sessions/dyno-session.entity';
import type { Shop } from '../shops/shop.entity';

/** What the analysis reads: bytes in memory or a file on disk. */
export type RunSource = Uint8Array | { path: string };

/** Why a file could not be read (an engine code, or READ_FAILED for anything unexpected). */
export interface RunError {
  code: ApiErrorCode;
  message: string;
  details?: unknown;
}

/** What one analysis attempt produced, ready to be written onto a Run. */
export interface AnalysisOutcome {
  status: RunStatus;
  result: AnalysisResult | null;
  error: RunError | null;
  mapping: ColumnMapping | null;
  headerSignature: string | null;
  correction: CorrectionStandard;
  conditions: Record<string, unknown>;
  /** Which pull of the file this outcome is (0-based) and how many pulls the file held. */
  pullIndex: number;
  pullCount: number;
  /** The engine-speed ratio the reading used (logs without an engine-speed column). */
  rpmPerSpeed: RpmPerSpeed | null;
}

/** How to read a file beyond recognition: a column mapping and/or an engine-speed ratio. */
export interface ReadingChoice {
  mapping?: ColumnMapping | null;
  rpmPerSpeed?: RpmPerSpeed | null;
}

export interface AnalysisContext {
  correction: CorrectionStandard;
  conditions: AnalyzeOptions['conditions'];
}

/** Analysis codes that carry mapping help: the run waits for a hand mapping. */
const MAPPING_CODES = new Set<ApiErrorCode>(['NEEDS_MAPPING', 'NO_RPM_COLUMN', 'NO_POWER_OR_TORQUE']);

/** Conditions and correction standard for a run: the session's, else the shop's default standard. */
export function analysisContext(session: DynoSession | null, shop: Shop | null): AnalysisContext {
  const wanted = session?.correctionStandard ?? shop?.defaultCorrection ?? 'sae-j1349';
  const correction: CorrectionStandard = isCorrectionStandard(wanted) ? wanted : 'sae-j1349';
  const conditions: NonNullable<AnalyzeOptions['conditions']> = {};
  if (session?.ambientTempC != null) conditions.temperatureC = session.ambientTempC;
  if (session?.baroKpa != null) conditions.baroKpa = session.baroKpa;
  if (session?.humidityPct != null) conditions.humidityPct = session.humidityPct;
  return { correction, conditions };
}

/** The shop's saved column layouts, by header signature. */
export async function shopLayouts(em: EntityManager, shopId: string): Promise<Map<string, ColumnMapping>> {
  const rows = await em.find(ColumnLayout, { shop: shopId });
  return new Map(rows.map((l) => [l.headerSignature, l.mapping as ColumnMapping]));
}

function errorOf(e: unknown): RunError {
  if (e instanceof AnalysisError) {
    const details = e.details ?? (e.line !== undefined || e.column !== undefined ? { line: e.line, column: e.column } : undefined);
    return { code: e.code, message: e.message, ...(details !== undefined ? { details } : {}) };
  }
  return { code: 'READ_FAILED', message: 'The file could not be read.' };
}

/** Applies the correction standard to one pull's peaks (or warns why it could not be). */
function correctPull(result: AnalysisResult, correction: CorrectionStandard): AnalysisResult {
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
 * One pass of the engine over every pull, uncorrected; the correction is applied here afterwards,
 * so a file with no known conditions (no session, nothing in its preamble) is read once, not twice.
 */
async function analyseOnce(source: RunSource, correction: CorrectionStandard, conditions: AnalyzeOptions['conditions'], choice: ReadingChoice): Promise<AnalysisPulls> {
  const options: AnalyzeOptions = { correction: 'none', conditions, ...(choice.mapping ? { mapping: choice.mapping } : {}), ...(choice.rpmPerSpeed ? { rpmPerSpeed: choice.rpmPerSpeed } : {}) };
  // analyzeFilePulls streams the file (memory bounded by the used columns, not the file) and gives
  // the same result as analyzeBufferPulls (tests/unit/analysis/stream.test.ts checks that).
  const all = source instanceof Uint8Array ? analyzeBufferPulls(source, options) : await analyzeFilePulls(source.path, options);
  return { ...all, pulls: all.pulls.map((p) => correctPull(p, correction)) };
}

/**
 * Every pull of a run file (bytes or a file on disk), one outcome each in time order; a file that
 * cannot be read is one outcome (failed or waiting for a mapping). Mapping precedence: the explicit
 * choice, then a saved column layout whose header signature matches, then automatic recognition.
 */
export async function analysePulls(source: RunSource, ctx: AnalysisContext, layouts: Map<string, ColumnMapping>, explicit: ReadingChoice | null = null): Promise<AnalysisOutcome[]> {
  const base = { correction: ctx.correction, conditions: { ...(ctx.conditions ?? {}) } };
  const attempt = async (choice: ReadingChoice): Promise<AnalysisOutcome[]> => {
    const mapping = choice.mapping ?? null;
    const rpmPerSpeed = choice.rpmPerSpeed ?? null;
    try {
      const all = await analyseOnce(source, ctx.correction, ctx.conditions, choice);
      return all.pulls.map((result) => ({
        ...base, status: 'ready', result, error: null, mapping, rpmPerSpeed, headerSignature: result.headerSignature, correction: result.correction.standard, conditions: result.conditions, pullIndex: result.pull.index, pullCount: result.pull.count,
      }));
    } catch (e) {
      const error = errorOf(e);
      const help = error.details as { headerSignature?: string } | undefined;
      const status: RunStatus = MAPPING_CODES.has(error.code) ? 'needs-mapping' : 'failed';
      return [{ ...base, status, result: null, error, mapping, rpmPerSpeed, headerSignature: typeof help?.headerSignature === 'string' ? help.headerSignature : null, pullIndex: 0, pullCount: 1 }];
    }
  };
  if (explicit && (explicit.mapping || explicit.rpmPerSpeed)) return attempt(explicit);
  const first = await attempt({});
  const signature = first[0].headerSignature;
  const saved = signature ? layouts.get(signature) : undefined;
  if (!saved) return first;
  const withLayout = await attempt({ mapping: saved });
  // A saved layout that no longer fits this file must not hide a good automatic reading.
  return withLayout[0].status === 'ready' || first[0].status !== 'ready' ? withLayout : first;
}

/**
 * One pull of a run file (the run's own, by index): what re-processing and a hand mapping read.
 * A file that now holds fewer pulls than `pullIndex` answers a failed outcome (PULL_NOT_FOUND).
 */
export async function analyseRun(source: RunSource, ctx: AnalysisContext, layouts: Map<string, ColumnMapping>, explicit: ReadingChoice | null = null, pullIndex = 0): Promise<AnalysisOutcome> {
  return pullOutcome(await analysePulls(source, ctx, layouts, explicit), pullIndex);
}

/** The outcome of pull `pullIndex` among a file's outcomes (see {@link analyseRun}). */
export function pullOutcome(outcomes: AnalysisOutcome[], pullIndex: number): AnalysisOutcome {
  const [first] = outcomes;
  if (first.status !== 'ready') return { ...first, pullIndex };
  const own = outcomes.find((o) => o.pullIndex === pullIndex);
  if (own) return own;
  return {
    ...first,
    status: 'failed',
    result: null,
    error: { code: 'PULL_NOT_FOUND', message: `The file now reads as ${outcomes.length} pull(s); pull ${pullIndex + 1} of it was not found. Check the file and its mapping.` },
    pullIndex,
  };
}

/** Every run an uploaded file yields, in order: one per pull of the log (or one that could not be read). */
export async function analyseUpload(source: RunSource, ctx: AnalysisContext, layouts: Map<string, ColumnMapping>): Promise<AnalysisOutcome[]> {
  return analysePulls(source, ctx, layouts);
}
