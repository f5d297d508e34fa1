/** Plain-language sentences about a comparison, from its figures only. */
import type { ComparisonResult, ComparisonUnits, ComparisonWarning } from '@shared/schemas/comparison';
import { hpTo, lbftTo } from '@shared/analysis/units';

/** A loss smaller than this (hp) is not worth a sentence. Our own threshold. */
export const NOTABLE_LOSS_HP = 0.5;
/** Share of the total positive gain area that "most of the gain" means. Our own threshold. */
export const MOST_OF_GAIN = 0.75;

interface Units {
  power: (hp: number) => number;
  torque: (lbft: number) => number;
  p: string;
  t: string;
}
function unitsOf(u: ComparisonUnits): Units {
  return u === 'kw-nm'
    ? { power: (v) => hpTo(v, 'kw'), torque: (v) => lbftTo(v, 'nm'), p: 'kW', t: 'N·m' }
    : { power: (v) => v, torque: (v) => v, p: 'hp', t: 'lb·ft' };
}
const signed = (v: number, d = 1) => {
  const s = Math.abs(v).toFixed(d);
  if (Number(s) === 0) return `±${s}`;
  return `${v > 0 ? '+' : '−'}${s}`;
};
const rpmText = (v: number) => Math.round(v).toLocaleString('en-US');

/** Plain sentences for one run against the baseline, from its figures only. */
export function describeResult(r: Omit<ComparisonResult, 'sentences'>, units: ComparisonUnits): string[] {
  const u = unitsOf(units);
  const parts: string[] = [];
  const peak = `${signed(u.power(r.peakPowerGain.hp))} ${u.p} at peak (${signed(r.peakPowerGain.pct)} %)`;
  parts.push(r.withinRepeatability.peakPower ? `${peak}, which is within run-to-run spread` : peak);

  const bands = r.bands;
  const positive = bands.map((b) => Math.max(0, b.averagePowerGainHp) * (b.to - b.from));
  const total = positive.reduce((s, v) => s + v, 0);
  if (total > 0 && bands.length >= 3) {
    let acc = 0;
    let above = bands.length - 1;
    for (let i = bands.length - 1; i >= 0; i--) {
      acc += positive[i];
      above = i;
      if (acc >= MOST_OF_GAIN * total) break;
    }
    acc = 0;
    let below = 0;
    for (let i = 0; i < bands.length; i++) {
      acc += positive[i];
      below = i;
      if (acc >= MOST_OF_GAIN * total) break;
    }
    if (above > 0 && bands.length - above <= below + 1) parts.push(`most of the gain is above ${rpmText(bands[above].from)} rpm`);
    else if (below < bands.length - 1) parts.push(`most of the gain is below ${rpmText(bands[below].to)} rpm`);
    else parts.push('the gain is spread across the range');
  } else if (r.averagePowerGainHp < 0) {
    parts.push(`on average ${signed(u.power(r.averagePowerGainHp))} ${u.p} across ${rpmText(r.commonRpm[0])}–${rpmText(r.commonRpm[1])} rpm`);
  }
  if (bands.length && bands.every((b) => b.withinRepeatability === true)) {
    parts.push('across the whole range the change is within run-to-run spread');
  } else {
    let low = -1;
    while (low + 1 < bands.length && bands[low + 1].withinRepeatability === true) low++;
    let high = bands.length;
    while (high - 1 > low && bands[high - 1].withinRepeatability === true) high--;
    if (low >= 0) parts.push(`below ${rpmText(bands[low].to)} rpm the change is within run-to-run spread`);
    if (high < bands.length) parts.push(`above ${rpmText(bands[high].from)} rpm the change is within run-to-run spread`);
  }
  const first = `${parts.join('; ')}.`;
  const second: string[] = [];
  second.push(`Peak torque ${signed(u.torque(r.peakTorqueGain.lbft))} ${u.t} (${signed(r.peakTorqueGain.pct)} %)`);
  if (Math.abs(r.peakPowerRpmShift) >= 200) second.push(`peak power moved ${rpmText(Math.abs(r.peakPowerRpmShift))} rpm ${r.peakPowerRpmShift > 0 ? 'higher' : 'lower'}`);
  if (r.largestLoss.hp <= -NOTABLE_LOSS_HP) second.push(`it gives away up to ${Math.abs(u.power(r.largestLoss.hp)).toFixed(1)} ${u.p} around ${rpmText(r.largestLoss.rpm)} rpm`);
  return [first, `${second.join('; ')}.`];
}

/**
 * The comparison's summary: one run's sentences, or one line per run against the baseline; then a
 * caution when no spread is known and when a warning that affects the figures is present.
 */
export function summarySentences(
  results: Pick<ComparisonResult, 'runId' | 'sentences'>[],
  nameOf: (runId: string) => string,
  baselineName: string,
  spreadKnown: boolean,
  warnings: Pick<ComparisonWarning, 'code'>[],
): string[] {
  const summary: string[] = [];
  if (results.length === 1) summary.push(...results[0].sentences);
  else {
    for (const r of results) {
      summary.push(`${nameOf(r.runId)} against ${baselineName}: ${r.sentences[0].charAt(0).toLowerCase()}${r.sentences[0].slice(1)}`);
    }
  }
  if (!spreadKnown) summary.push('No stage in this comparison has two or more runs, so run-to-run spread is unknown; treat small differences with care.');
  if (warnings.some((w) => w.code !== 'SEVERAL_BIKES' && w.code !== 'DYNO_UNKNOWN')) summary.push('Read these figures with the warnings below in mind.');
  return summary;
}
