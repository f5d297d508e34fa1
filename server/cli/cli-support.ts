/**
 * Shared pieces of the `analyze` and `compare` command lines: option parsing, usage answers and the stable JSON
 * summaries (the shapes are a public interface used by outside checks — change them only by
 * adding keys).
 */
import type { AnalysisResult, AnalyzeOptions } from '@shared/analysis/analyze';
import type { ColumnMapping } from '@shared/analysis/columns';
import { isCorrectionStandard } from '@shared/analysis/correction';
import { AnalysisError } from '@shared/analysis/errors';

/** Parsed command line. */
export interface CliArgs {
  json: boolean;
  curve: boolean;
  help: boolean;
  files: string[];
  options: AnalyzeOptions;
  bandWidthRpm?: number;
}

function numberArg(flag: string, value: string | undefined): number {
  const n = Number(value);
  if (value === undefined || value.trim() === '' || !Number.isFinite(n)) throw new AnalysisError('INVALID_OPTION', `${flag} needs a number.`);
  return n;
}

function positiveArg(flag: string, value: string | undefined): number {
  const n = numberArg(flag, value);
  if (!(n > 0)) throw new AnalysisError('INVALID_OPTION', `${flag} needs a positive number.`);
  return n;
}

/**
 * Parses the command line of a command, or answers the exit code when there is nothing to run:
 * 2 with the usage on stderr for bad options or the wrong number of files, 0 with it on stdout for --help.
 */
export function readCliArgs(argv: string[], usage: string, filesOk: (count: number) => boolean): CliArgs | number {
  let args;
  try {
    args = parseCliArgs(argv);
  } catch (e) {
    process.stderr.write(`${e instanceof Error ? e.message : String(e)}\n${usage}\n`);
    return 2;
  }
  if (args.help || !filesOk(args.files.length)) {
    (args.help ? process.stdout : process.stderr).write(`${usage}\n`);
    return args.help ? 0 : 2;
  }
  return args;
}

/** Parses argv (without node and script). Throws INVALID_OPTION. */
export function parseCliArgs(argv: string[]): CliArgs {
  const out: CliArgs = { json: false, curve: false, help: false, files: [], options: {} };
  const conditions: NonNullable<AnalyzeOptions['conditions']> = {};
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const [flag, inline] = a.startsWith('--') && a.includes('=') ? [a.slice(0, a.indexOf('=')), a.slice(a.indexOf('=') + 1)] : [a, undefined];
    const value = () => (inline !== undefined ? inline : argv[++i]);
    switch (flag) {
      case '--json': out.json = true; break;
      case '--curve': out.curve = true; break;
      case '-h': case '--help': out.help = true; break;
      case '--grid': out.options.gridRpm = numberArg(flag, value()); break;
      case '--smooth': out.options.smooth = numberArg(flag, value()); break;
      case '--bands': out.bandWidthRpm = numberArg(flag, value()); break;
      case '--correction': {
        const v = value();
        if (!isCorrectionStandard(v)) throw new AnalysisError('INVALID_OPTION', `--correction must be one of none, sae-j1349, sae-j1349-1990, iso-1585, din-70020, sae-j607.`);
        out.options.correction = v;
        break;
      }
      case '--temp': conditions.temperatureC = numberArg(flag, value()); break;
      case '--baro': conditions.baroKpa = numberArg(flag, value()); break;
      case '--humidity': conditions.humidityPct = numberArg(flag, value()); break;
      case '--rpm-per-mph': out.options.rpmPerSpeed = { ratio: positiveArg(flag, value()), unit: 'mph' }; break;
      case '--rpm-per-kmh': out.options.rpmPerSpeed = { ratio: positiveArg(flag, value()), unit: 'km/h' }; break;
      case '--map': {
        const v = value();
        try {
          out.options.mapping = JSON.parse(v ?? '') as ColumnMapping;
        } catch {
          throw new AnalysisError('INVALID_OPTION', '--map needs JSON, e.g. {"rpm":"RPM","torque":{"column":"TQ","unit":"nm"}}.');
        }
        if (!out.options.mapping || typeof out.options.mapping !== 'object') throw new AnalysisError('INVALID_OPTION', '--map needs a JSON object.');
        break;
      }
      default:
        if (a.startsWith('--')) throw new AnalysisError('INVALID_OPTION', `Unknown option ${a}.`);
        out.files.push(a);
    }
  }
  if (Object.keys(conditions).length > 0) out.options.conditions = conditions;
  return out;
}

/** Rounds for display/JSON (keeps integers integral). */
export function round(v: number, decimals: number): number {
  if (!Number.isFinite(v)) return v;
  const f = 10 ** decimals;
  return Math.round(v * f) / f;
}

/**
 * The `analyze --json` object for a successful file (issue 3 shape). `droppedPoints` counts the
 * rows outside the kept sweep (lead-in, deceleration tail, blank rows).
 */
export function successSummary(file: string, r: AnalysisResult, withCurve = false): Record<string, unknown> {
  const summary: Record<string, unknown> = {
    file,
    ok: true,
    columns: r.columns,
    units: r.units,
    points: r.points,
    droppedPoints: r.droppedPoints,
    rpmRange: r.rpmRange,
    peakPower: { hp: round(r.peakPower.hp, 2), rpm: r.peakPower.rpm },
    peakTorque: { lbft: round(r.peakTorque.lbft, 2), rpm: r.peakTorque.rpm },
    identity: { status: r.identity.status, maxDeviationPct: round(r.identity.maxDeviationPct, 2) },
    correction: { standard: r.correction.standard, factor: round(r.correction.factor, 4) },
    conditions: r.conditions,
    warnings: r.warnings,
  };
  if (withCurve) summary.curve = r.curve;
  return summary;
}

/**
 * The `analyze --json` object for one pull of a log holding several: the single-pull object plus
 * `pull` (which pull, where) and `review` (too many glitches).
 */
export function pullSummary(file: string, r: AnalysisResult, withCurve = false): Record<string, unknown> {
  const { index, count, main, partial, sampleRange, lineRange, timeRange } = r.pull;
  return { ...successSummary(file, r, withCurve), pull: { index, count, main, partial, sampleRange, lineRange, timeRange }, review: r.review };
}

/** The `analyze --json` object for a failed file. */
export function failureSummary(file: string, e: unknown): Record<string, unknown> {
  const err = e instanceof AnalysisError ? e : new AnalysisError('READ_FAILED', 'The file could not be read.');
  const error: Record<string, unknown> = { code: err.code, message: err.message };
  if (err.line !== undefined) error.line = err.line;
  if (err.column !== undefined) error.column = err.column;
  return { file, ok: false, error };
}

/** Prints without a stack trace and exits with `code` (for unexpected failures too). */
export function installCrashGuard(): void {
  const bail = (e: unknown) => {
    const msg = e instanceof Error ? e.message : String(e);
    process.stderr.write(`error: ${msg}\n`);
    process.exit(2);
  };
  process.on('uncaughtException', bail);
  process.on('unhandledRejection', bail);
}
