/**
 * Fairness warnings: what makes a comparison less than like-for-like (mixed correction standards,
 * different or unknown dynos, air too far apart, failed cross-checks, what the run-file engine had
 * to do to read a run, little rpm overlap, several bikes).
 */
import { type ComparisonWarning, MAX_PRESSURE_APART_KPA, MAX_TEMPERATURE_APART_C, MIN_OVERLAP_FRACTION } from '@shared/schemas/comparison';
import { cTo, kpaTo } from '@shared/analysis/units';
import { standardLabel } from './labels';
import type { Prepared } from './types';

// Both unit systems in warnings: they are read on screens and in PDFs of either (°F = °C × 1.8 + 32;
// 1 inHg = 3.38638 kPa, NIST SP 811).
const airTemp = (c: number) => `${c.toFixed(1)} °C / ${cTo(c, 'f').toFixed(1)} °F`;
const baro = (kpa: number) => `${kpa.toFixed(1)} kPa / ${kpaTo(kpa, 'inhg').toFixed(2)} inHg`;

/** The runs' own warnings (e.g. CONDITIONS_MISSING) followed by the warnings about the set. */
export function fairnessWarnings(all: Prepared[], baseline: Prepared): ComparisonWarning[] {
  const out: ComparisonWarning[] = all.flatMap((p) => p.warnings);
  const ids = all.map((p) => p.run.id);
  const list = (ps: Prepared[]) => ps.map((p) => `“${p.summary.name}”`).join(', ');

  const standards = new Set(all.map((p) => p.summary.correction.standard));
  if (standards.size > 1) {
    out.push({
      code: 'MIXED_CORRECTION',
      message: `The runs are corrected to different standards (${[...standards].map(standardLabel).join(', ')}); figures are only comparable under one standard. Choose a correction standard for all runs.`,
      runIds: ids,
    });
  }
  const dynos = new Map<string, string>();
  for (const p of all) if (p.summary.dynoId) dynos.set(p.summary.dynoId, p.summary.dynoName ?? 'unnamed dyno');
  if (dynos.size > 1) {
    out.push({
      code: 'DIFFERENT_DYNOS',
      message: `The runs were made on different dynos (${[...dynos.values()].join(', ')}); dynos read differently, so part of any difference may be the dyno.`,
      runIds: ids,
    });
  } else {
    const unknown = all.filter((p) => !p.summary.dynoId);
    if (unknown.length && unknown.length < all.length) {
      out.push({
        code: 'DYNO_UNKNOWN',
        message: `No dyno is recorded for ${list(unknown)}; check that every run was made on the same dyno.`,
        runIds: unknown.map((p) => p.run.id),
      });
    }
  }
  const spreadOf = (key: 'temperatureC' | 'baroKpa') => {
    const known = all.filter((p) => p.summary.conditions[key] !== null);
    if (known.length < 2) return null;
    const lo = known.reduce((a, b) => (b.summary.conditions[key]! < a.summary.conditions[key]! ? b : a));
    const hi = known.reduce((a, b) => (b.summary.conditions[key]! > a.summary.conditions[key]! ? b : a));
    return { lo, hi, apart: hi.summary.conditions[key]! - lo.summary.conditions[key]! };
  };
  const t = spreadOf('temperatureC');
  if (t && t.apart > MAX_TEMPERATURE_APART_C) {
    out.push({
      code: 'TEMPERATURE_APART',
      message: `Air temperature differs by ${t.apart.toFixed(1)} °C / ${(t.apart * 1.8).toFixed(1)} °F (${airTemp(t.lo.summary.conditions.temperatureC!)} for “${t.lo.summary.name}”, ${airTemp(t.hi.summary.conditions.temperatureC!)} for “${t.hi.summary.name}”); correction does not fully even out more than ${MAX_TEMPERATURE_APART_C} °C (${MAX_TEMPERATURE_APART_C * 1.8} °F).`,
      runIds: [t.lo.run.id, t.hi.run.id],
    });
  }
  const p = spreadOf('baroKpa');
  if (p && p.apart > MAX_PRESSURE_APART_KPA) {
    out.push({
      code: 'PRESSURE_APART',
      message: `Barometric pressure differs by ${p.apart.toFixed(1)} kPa / ${kpaTo(p.apart, 'inhg').toFixed(2)} inHg (“${p.lo.summary.name}” ${baro(p.lo.summary.conditions.baroKpa!)}, “${p.hi.summary.name}” ${baro(p.hi.summary.conditions.baroKpa!)}); more than ${MAX_PRESSURE_APART_KPA} kPa (${kpaTo(MAX_PRESSURE_APART_KPA, 'inhg').toFixed(2)} inHg) apart.`,
      runIds: [p.lo.run.id, p.hi.run.id],
    });
  }
  const mismatch = all.filter((x) => x.summary.identityStatus === 'mismatch');
  if (mismatch.length) {
    out.push({
      code: 'CROSS_CHECK_MISMATCH',
      message: `In ${list(mismatch)} power does not match torque × rpm (cross-check failed); check the file's columns and units before trusting the figures.`,
      runIds: mismatch.map((x) => x.run.id),
    });
  }
  out.push(...engineWarnings(all, list));
  for (const o of all) {
    if (o === baseline) continue;
    const lo = Math.max(o.summary.rpmMin, baseline.summary.rpmMin);
    const hi = Math.min(o.summary.rpmMax, baseline.summary.rpmMax);
    const narrower = Math.min(o.summary.rpmMax - o.summary.rpmMin, baseline.summary.rpmMax - baseline.summary.rpmMin);
    const overlap = Math.max(0, hi - lo);
    if (narrower > 0 && overlap < MIN_OVERLAP_FRACTION * narrower) {
      out.push({
        code: 'LITTLE_OVERLAP',
        message: `“${o.summary.name}” and the baseline share only ${Math.round(overlap)} rpm (${Math.round((overlap / narrower) * 100)} % of the narrower run's range); the area and average figures cover only that slice.`,
        runIds: [baseline.run.id, o.run.id],
      });
    }
  }
  const bikes = new Set(all.map((x) => x.summary.bikeId));
  if (bikes.size > 1) {
    out.push({
      code: 'SEVERAL_BIKES',
      message: `The runs come from ${bikes.size} different bikes; differences include everything that differs between the bikes, not only the parts.`,
      runIds: ids,
    });
  }
  return out;
}

const hasCode = (p: Prepared, code: string) => (p.run.warnings ?? []).some((w) => w.code === code);

/**
 * What the run-file engine flagged on the runs and that bears on the comparison: a run marked for
 * a check by hand (too many glitches), glitches dropped, a pull aborted early, engine speed
 * computed from road speed with a ratio.
 */
function engineWarnings(all: Prepared[], list: (ps: Prepared[]) => string): ComparisonWarning[] {
  const out: ComparisonWarning[] = [];
  const review = all.filter((p) => hasCode(p, 'GLITCHES_REVIEW'));
  if (review.length) {
    out.push({
      code: 'RUN_NEEDS_REVIEW',
      message: `${list(review)} ${review.length > 1 ? 'are' : 'is'} marked for review: more than a tenth of the samples were impossible engine-speed or load jumps and were dropped. Check the run's file and trace by hand before trusting its figures.`,
      runIds: review.map((p) => p.run.id),
    });
  }
  const glitches = all.filter((p) => hasCode(p, 'GLITCHES_DROPPED') && !hasCode(p, 'GLITCHES_REVIEW'));
  if (glitches.length) {
    out.push({
      code: 'GLITCHES_DROPPED',
      message: `In ${list(glitches)} a few samples with impossible engine-speed or load jumps were dropped before the curve was drawn; see the run's warnings for where.`,
      runIds: glitches.map((p) => p.run.id),
    });
  }
  const partial = all.filter((p) => hasCode(p, 'PULL_PARTIAL'));
  if (partial.length) {
    out.push({
      code: 'PARTIAL_PULL',
      message: `${list(partial)} ${partial.length > 1 ? 'are pulls' : 'is a pull'} aborted early (a partial sweep); figures above its last rpm are missing, not lower.`,
      runIds: partial.map((p) => p.run.id),
    });
  }
  const fromSpeed = all.filter((p) => hasCode(p, 'RPM_FROM_SPEED'));
  if (fromSpeed.length) {
    out.push({
      code: 'RPM_FROM_SPEED',
      message: `In ${list(fromSpeed)} engine speed was computed from road speed with a given ratio; the rpm axis is only right if that ratio fits the gear used.`,
      runIds: fromSpeed.map((p) => p.run.id),
    });
  }
  return out;
}
