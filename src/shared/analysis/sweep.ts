/**
 * Sweep isolation: a dyno log usually holds a steady or idle part before the pull and the
 * throttle-off deceleration after it. The main sweep is the stretch with the largest rpm rise in
 * which rpm never falls more than a jitter tolerance below its running maximum.
 */

/** Index range [start, end] (inclusive) of the main sweep, and its rpm rise. */
export interface SweepRange {
  start: number;
  end: number;
  riseRpm: number;
}

/** Allowed fall below the running maximum before a stretch is considered ended (sensor jitter). */
export function jitterTolerance(rpm: number): number {
  return Math.max(40, 0.015 * rpm);
}

interface Stretch {
  start: number;
  maxIdx: number;
  minBefore: number;
  gain: number;
}

/**
 * The stretches of `rpm[0..n)` in which rpm never falls more than the jitter tolerance below its
 * running maximum: those rising by `minRise` or more (in order), and the one rising most. (A
 * coast-down is a stretch per sample: they are not kept, so memory stays small on long logs.)
 */
function stretches(rpm: ArrayLike<number>, n: number, minRise: number): { kept: Stretch[]; best: Stretch } {
  const out: Stretch[] = [];
  let best: Stretch | null = null;
  let start = 0;
  let runMax = rpm[0];
  let maxIdx = 0;
  let runMin = rpm[0];
  let minBeforeMax = rpm[0];
  const close = () => {
    const gain = runMax - minBeforeMax;
    if (gain < minRise && best && gain <= best.gain) return;
    const st = { start, maxIdx, minBefore: minBeforeMax, gain };
    if (gain >= minRise) out.push(st);
    if (!best || gain > best.gain) best = st;
  };
  for (let i = 1; i < n; i++) {
    const r = rpm[i];
    if (r >= runMax - jitterTolerance(runMax)) {
      if (r < runMin) runMin = r;
      if (r > runMax) {
        runMax = r;
        maxIdx = i;
        minBeforeMax = runMin;
      }
    } else {
      close();
      start = i;
      runMax = runMin = minBeforeMax = r;
      maxIdx = i;
    }
  }
  close();
  return { kept: out, best: best as unknown as Stretch };
}

/** Drops the steady lead-in: the sweep starts where rpm last sat near the stretch's minimum. */
function toRange(rpm: ArrayLike<number>, b: Stretch): SweepRange {
  const tol = jitterTolerance(b.minBefore);
  let sweepStart = b.start;
  for (let i = b.start; i <= b.maxIdx; i++) if (rpm[i] <= b.minBefore + tol) sweepStart = i;
  return { start: sweepStart, end: b.maxIdx, riseRpm: b.gain };
}

/** Finds the main accelerating sweep (the largest rpm rise) in `rpm[0..n)`. Returns null for fewer than two points. */
export function findSweep(rpm: ArrayLike<number>, n = rpm.length): SweepRange | null {
  if (n < 2) return null;
  return toRange(rpm, stretches(rpm, n, Infinity).best);
}

/**
 * Finds every accelerating sweep of `rpm[0..n)` rising by at least `minRise` rpm, in time order
 * (several wide-open-throttle pulls separated by coast-downs or idling). Coast-downs never belong
 * to a sweep: a stretch ends as soon as rpm falls below its running maximum by more than jitter.
 */
export function findSweeps(rpm: ArrayLike<number>, minRise: number, n = rpm.length): SweepRange[] {
  if (n < 2) return [];
  return stretches(rpm, n, minRise).kept.map((s) => toRange(rpm, s));
}

function medianOfRange(v: ArrayLike<number>, from: number, to: number): number {
  const s = Array.from({ length: to - from }, (_, i) => v[from + i]).sort((a, b) => a - b);
  return s.length ? s[s.length >> 1] : NaN;
}

/**
 * Trims part-throttle points at the edges of a sweep: the last lead-in samples and the
 * throttle-off moment at the top, where rpm is still in the sweep but the load has collapsed.
 * `load` is torque (or power) per sweep point. Returns the kept index range [from, to).
 */
export function trimThrottleEdges(load: ArrayLike<number>): { from: number; to: number } {
  const n = load.length;
  const edge = Math.max(3, Math.floor(n * 0.2));
  if (n < 2 * edge) return { from: 0, to: n };
  const refStart = medianOfRange(load, 0, edge);
  const refEnd = medianOfRange(load, n - edge, n);
  let from = 0;
  let to = n;
  while (from < edge && !(load[from] >= 0.7 * refStart)) from++;
  while (to > n - edge && !(load[to - 1] >= 0.7 * refEnd)) to--;
  return { from, to };
}
