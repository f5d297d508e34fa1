/**
 * Progress for long command-line work (reprocess, import): on a terminal a cli-progress bar with
 * the count, the rate and the time left, each item's line printed above it; piped or redirected,
 * plain lines with "[n/total]" so a log file stays readable. Either way the caller ends with a
 * summary line.
 */
import cliProgress from 'cli-progress';

/** Items per second and seconds left, from what is done so far (null until there is a rate). */
export function progressFigures(done: number, total: number, elapsedMs: number): { rate: number | null; etaSeconds: number | null } {
  if (done <= 0 || elapsedMs <= 0) return { rate: null, etaSeconds: null };
  const rate = done / (elapsedMs / 1000);
  return { rate, etaSeconds: Math.max(0, total - done) / rate };
}

/** "0:09", "12:05", "1:02:03". */
export function formatDuration(seconds: number | null): string {
  if (seconds === null || !Number.isFinite(seconds)) return '–';
  const s = Math.round(seconds);
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const sec = String(s % 60).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${sec}` : `${m}:${sec}`;
}

/** "12/40 runs · 3.2 runs/s · 0:09 left". */
export function progressText(done: number, total: number, elapsedMs: number, noun: string): string {
  const { rate, etaSeconds } = progressFigures(done, total, elapsedMs);
  return `${done}/${total} ${noun} · ${rate === null ? '–' : rate.toFixed(1)} ${noun}/s · ${formatDuration(etaSeconds)} left`;
}

export interface Progress {
  /** One item done; its line (if any) is printed above the bar, or as a plain line. */
  tick(line?: string): void;
  /** Removes the bar and prints the summary. */
  finish(summary: string): void;
}

export function startProgress(opts: { total: number; noun: string; stream?: NodeJS.WriteStream; now?: () => number }): Progress {
  const stream = opts.stream ?? process.stdout;
  const now = opts.now ?? Date.now;
  const started = now();
  let done = 0;
  if (!stream.isTTY) {
    return {
      tick(line) {
        done += 1;
        stream.write(`[${done}/${opts.total}] ${line ?? ''}\n`);
      },
      finish(summary) {
        stream.write(`${summary} (${formatDuration((now() - started) / 1000)})\n`);
      },
    };
  }
  const multi = new cliProgress.MultiBar(
    { stream, format: `{bar} {text}`, hideCursor: true, clearOnComplete: true, barsize: 28, etaBuffer: 50 },
    cliProgress.Presets.shades_classic,
  );
  const bar = multi.create(opts.total, 0, { text: progressText(0, opts.total, 0, opts.noun) });
  return {
    tick(line) {
      done += 1;
      if (line) multi.log(`${line}\n`);
      bar.update(done, { text: progressText(done, opts.total, now() - started, opts.noun) });
    },
    finish(summary) {
      multi.stop();
      stream.write(`${summary} (${formatDuration((now() - started) / 1000)})\n`);
    },
  };
}
