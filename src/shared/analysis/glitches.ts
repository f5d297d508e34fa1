/**
 * Glitch rejection: samples whose engine speed jumps in a way no engine on a dyno can (a pickup
 * dropping out to zero, reading double or half, single-sample spikes) are found before the sweep
 * is isolated, so peaks are read from the cleaned curve.
 *
 * Two robust tests, both O(n) for the fixed window:
 *  1. A Hampel filter (Hampel 1974; Pearson et al. 2016, "Generalized Hampel filters", EURASIP J.
 *     Adv. Signal Process. 2016:87): a sample is an outlier when it lies more than
 *     3 × 1.4826 × MAD from the median of its 11-sample window (1.4826 makes the MAD a consistent
 *     estimate of a normal standard deviation). A floor (150 rpm or 8 % of the level, whichever is
 *     larger) keeps a perfectly smooth window (MAD 0) from flagging tiny steps. It catches
 *     isolated glitches up to 5 samples long. The load channel (torque or power) gets the same test
 *     (floor 2 units or 10 %), so a load spike without an rpm jump is dropped too.
 *  2. A physical rate limit for longer stretches: engine speed may change by at most 25 % of its
 *     level (at least 300 rpm) from one sample to the next, plus twice the log's typical step per
 *     skipped sample. A loaded engine on a dyno sampled at 10 Hz or more changes by a few percent
 *     per sample (common practice, no published source); halving, doubling or dropping to zero is
 *     far outside. A rejected stretch that never returns to the accepted level is taken back (it is a
 *     real level change, e.g. a paused log), unless it sits at about double, half or zero of the
 *     accepted level: those are the pickup faults.
 */

/** Half width of the Hampel window (window = 2k + 1 samples). */
export const HAMPEL_HALF_WIDTH = 5;
/** Hampel threshold in robust standard deviations. */
export const HAMPEL_SIGMAS = 3;
/** MAD → standard deviation for normal data (1 / Φ⁻¹(3/4)). */
export const MAD_TO_SD = 1.4826;
/** Floor of the rpm outlier threshold. */
const RPM_FLOOR_ABS = 150;
const RPM_FLOOR_REL = 0.08;
/** Floor of the load outlier threshold. */
const LOAD_FLOOR_ABS = 2;
const LOAD_FLOOR_REL = 0.1;
/** Largest plausible change of engine speed between consecutive samples. */
export const MAX_STEP_REL = 0.25;
export const MAX_STEP_RPM = 300;

/** Glitch marks per sample: 0 = good; otherwise which test dropped it. */
export const GlitchMark = { Good: 0, Rpm: 1, Load: 2, Stretch: 3 } as const;
type GlitchMarkValue = (typeof GlitchMark)[keyof typeof GlitchMark];

function insertionSort(a: Float64Array, len: number): void {
  for (let i = 1; i < len; i++) {
    const v = a[i];
    let j = i - 1;
    while (j >= 0 && a[j] > v) {
      a[j + 1] = a[j];
      j--;
    }
    a[j + 1] = v;
  }
}

/** Median and MAD of `len` values in `win` (sorted in place; `dev` is scratch). */
function windowLimit(win: Float64Array, dev: Float64Array, len: number, floorAbs: number, floorRel: number, x: number): boolean {
  insertionSort(win, len);
  const med = len & 1 ? win[len >> 1] : (win[(len >> 1) - 1] + win[len >> 1]) / 2;
  return isOutlier(win, dev, len, med, floorAbs, floorRel, x);
}

/** True when `x` lies beyond the Hampel limit around `med` of the sorted window. */
function isOutlier(sorted: Float64Array, dev: Float64Array, len: number, med: number, floorAbs: number, floorRel: number, x: number): boolean {
  const d = Math.abs(x - med);
  // The limit is never below the floor: no MAD needed for a sample inside it.
  if (d <= floorAbs || d <= floorRel * Math.abs(med)) return false;
  for (let j = 0; j < len; j++) dev[j] = Math.abs(sorted[j] - med);
  insertionSort(dev, len);
  const mad = len & 1 ? dev[len >> 1] : (dev[(len >> 1) - 1] + dev[len >> 1]) / 2;
  return d > HAMPEL_SIGMAS * MAD_TO_SD * mad;
}

/**
 * Hampel test of `x` on raw values (the standard, non-recursive filter); marks outliers with `mark`
 * unless already marked. Only samples next to a step of at least half the floor are tested (a
 * sample within half the floor of both neighbours is the edge of no spike); longer stretches are
 * left to the rate limit. The MAD is only computed for samples outside the floor.
 */
function hampel(x: ArrayLike<number>, marks: Uint8Array, mark: GlitchMarkValue, floorAbs: number, floorRel: number): void {
  const n = x.length;
  const k = HAMPEL_HALF_WIDTH;
  const win = new Float64Array(2 * k + 1);
  const dev = new Float64Array(2 * k + 1);
  for (let i = 0; i < n; i++) {
    const v = x[i];
    const half = 0.5 * Math.max(floorAbs, floorRel * Math.abs(v));
    const prev = i > 0 ? Math.abs(v - x[i - 1]) : 0;
    const next = i < n - 1 ? Math.abs(x[i + 1] - v) : 0;
    if (prev <= half && next <= half) continue;
    let len = 0;
    for (let j = Math.max(0, i - k); j <= Math.min(n - 1, i + k); j++) win[len++] = x[j];
    if (len >= 3 && windowLimit(win, dev, len, floorAbs, floorRel, v) && marks[i] === GlitchMark.Good) marks[i] = mark;
  }
}

/** Median of up to 4096 evenly spaced |steps| between good consecutive samples. */
function typicalStep(x: ArrayLike<number>, marks: Uint8Array): number {
  const n = x.length;
  const stride = Math.max(1, Math.floor(n / 4096));
  const steps: number[] = [];
  for (let i = 1; i < n; i += stride) if (!marks[i] && !marks[i - 1]) steps.push(Math.abs(x[i] - x[i - 1]));
  if (steps.length === 0) return 0;
  steps.sort((a, b) => a - b);
  return steps[steps.length >> 1];
}

/** True when `x` is about double, half or zero of `ref`: the signature of a pickup fault. */
function looksLikePickupFault(x: number, ref: number): boolean {
  if (ref <= 0) return false;
  const r = x / ref;
  return r < 0.1 || Math.abs(r - 2) < 0.15 || Math.abs(r - 0.5) < 0.08;
}

/** Rate-limit walk over the samples the Hampel test kept. */
function rateLimit(rpm: ArrayLike<number>, marks: Uint8Array): void {
  const n = rpm.length;
  const typical = typicalStep(rpm, marks);
  const maxRun = Math.max(20, Math.ceil(0.1 * n));
  let refIdx = -1;
  let runStart = -1;
  let runLen = 0;
  for (let i = 0; i < n; i++) {
    if (marks[i]) continue;
    if (refIdx < 0) {
      refIdx = i;
      continue;
    }
    const ref = rpm[refIdx];
    const limit = Math.max(MAX_STEP_RPM, MAX_STEP_REL * ref) + 2 * (i - refIdx) * typical;
    if (Math.abs(rpm[i] - ref) <= limit) {
      refIdx = i;
      runStart = -1;
      runLen = 0;
      continue;
    }
    marks[i] = GlitchMark.Stretch;
    if (runStart < 0) runStart = i;
    runLen++;
    if (runLen > maxRun && !looksLikePickupFault(rpm[i], ref)) {
      // A lasting new level: take the stretch back and follow it.
      for (let j = runStart; j <= i; j++) if (marks[j] === GlitchMark.Stretch) marks[j] = GlitchMark.Good;
      refIdx = i;
      runStart = -1;
      runLen = 0;
    }
  }
}

/**
 * Finds glitches in a log. `load` is torque (or power) per sample, or null. Returns one mark per
 * sample (0 = good) and the number of marked samples.
 */
export function findGlitches(rpm: ArrayLike<number>, load: ArrayLike<number> | null): { marks: Uint8Array; count: number } {
  const n = rpm.length;
  const marks = new Uint8Array(n);
  hampel(rpm, marks, GlitchMark.Rpm, RPM_FLOOR_ABS, RPM_FLOOR_REL);
  rateLimit(rpm, marks);
  if (load) hampel(load, marks, GlitchMark.Load, LOAD_FLOOR_ABS, LOAD_FLOOR_REL);
  let count = 0;
  for (let i = 0; i < n; i++) if (marks[i]) count++;
  return { marks, count };
}

/** A contiguous range of dropped samples (indices into the collected rows, inclusive). */
export interface GlitchRange {
  from: number;
  to: number;
}

/** Groups marked samples into contiguous ranges. */
export function glitchRanges(marks: Uint8Array, from = 0, to = marks.length - 1): GlitchRange[] {
  const out: GlitchRange[] = [];
  let start = -1;
  for (let i = from; i <= to + 1; i++) {
    const bad = i <= to && marks[i] !== 0;
    if (bad && start < 0) start = i;
    if (!bad && start >= 0) {
      out.push({ from: start, to: i - 1 });
      start = -1;
    }
  }
  return out;
}
