/**
 * Reading a run file with the engine: the correction standard and conditions that apply, the
 * shop's saved column layouts, and the outcome (ready, needs a mapping, or failed) of one file.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { ApiErrorCode } from '@shared/errors';
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
export async function analyseRun(source: RunSource, ctx: AnalysisContext, layouts: Map<string, ColumnMapping>, explicit: ColumnMapping | null = null): Promise<AnalysisOutcome> {
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

/**
 * Every run an uploaded file yields, in order. Today a file is one pull, so one outcome; a log
 * holding several pulls will answer one outcome per pull here (each with its pull index and time
 * range), and the upload pipeline already saves one run per outcome.
 */
export async function analyseUpload(source: RunSource, ctx: AnalysisContext, layouts: Map<string, ColumnMapping>): Promise<AnalysisOutcome[]> {
  return [await analyseRun(source, ctx, layouts)];
}
