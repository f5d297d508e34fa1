import { describe, expect, it } from 'vitest';
import type { ComparisonResult } from '@shared/schemas/comparison';
import { describeResult, summarySentences } from '@server/modules/comparisons/engine';

type Figures = Omit<ComparisonResult, 'sentences'>;

const band = (from: number, gain: number, withinRepeatability: boolean | null = null) => ({
  from,
  to: from + 1000,
  averagePowerGainHp: gain,
  averageTorqueGainLbft: 0,
  spreadHp: null,
  withinRepeatability,
});

/** A hand-worked example: a gain that grows with rpm. */
function figures(over: Partial<Figures> = {}): Figures {
  return {
    runId: 'b',
    commonRpm: [2000, 6000],
    peakPowerGain: { hp: 5.04, pct: 3.2 },
    peakTorqueGain: { lbft: 4, pct: 2.9 },
    peakPowerRpmShift: 300,
    peakTorqueRpmShift: 0,
    areaGainPct: 2.5,
    averagePowerGainHp: 2.1,
    averageTorqueGainLbft: 1.2,
    bands: [band(2000, 0, true), band(3000, 0.5, true), band(4000, 3), band(5000, 5)],
    largestGain: { rpm: 6000, hp: 5.5 },
    largestLoss: { rpm: 2500, hp: -0.8 },
    spread: { peakPowerHp: null, peakTorqueLbft: null, averagePowerHp: null },
    withinRepeatability: { peakPower: false, peakTorque: false, averagePower: false },
    delta: { rpm: [], powerHp: [], torqueLbft: [] },
    ...over,
  };
}

describe('comparison engine: plain sentences', () => {
  it('describes a gain that grows with rpm (worked example)', () => {
    // Positive band areas 0, 500, 3,000, 5,000 hp·rpm (total 8,500); 75 % = 6,375 is reached from
    // the top at the 4,000 rpm band (5,000 + 3,000), from the bottom only at the last band: "above 4,000".
    // Bands 1–2 are within spread from the bottom up to 4,000 rpm.
    expect(describeResult(figures(), 'hp-lbft')).toEqual([
      '+5.0 hp at peak (+3.2 %); most of the gain is above 4,000 rpm; below 4,000 rpm the change is within run-to-run spread.',
      'Peak torque +4.0 lb·ft (+2.9 %); peak power moved 300 rpm higher; it gives away up to 0.8 hp around 2,500 rpm.',
    ]);
  });

  it('speaks kW and N·m for metric shops (1 hp = 745.6999 W, 1 lbf·ft = 1.355818 N·m, NIST SP 811)', () => {
    const [first, second] = describeResult(figures(), 'kw-nm');
    // 5.04 hp × 0.7456999 = 3.758 kW; 4 lb·ft × 1.355818 = 5.423 N·m; 0.8 hp × 0.7456999 = 0.597 kW.
    expect(first.startsWith(`+${((5.04 * 745.6999) / 1000).toFixed(1)} kW at peak (+3.2 %)`)).toBe(true);
    expect(first.startsWith('+3.8 kW at peak')).toBe(true);
    expect(second).toBe('Peak torque +5.4 N·m (+2.9 %); peak power moved 300 rpm higher; it gives away up to 0.6 kW around 2,500 rpm.');
  });

  it('says when the peak gain is within run-to-run spread, and when the whole range is', () => {
    const all = figures({
      withinRepeatability: { peakPower: true, peakTorque: true, averagePower: true },
      bands: [band(2000, 0.2, true), band(3000, 0.3, true), band(4000, 0.4, true)],
      peakPowerRpmShift: 100,
      largestLoss: { rpm: 2000, hp: -0.3 },
    });
    // Areas 200, 300, 400 (total 900, 75 % = 675): from the top 400 + 300 = 700 at the 3,000 band;
    // from the bottom 200 + 300 + 400 only at the last band, so "above 3,000 rpm".
    expect(describeResult(all, 'hp-lbft')).toEqual([
      '+5.0 hp at peak (+3.2 %), which is within run-to-run spread; most of the gain is above 3,000 rpm; across the whole range the change is within run-to-run spread.',
      'Peak torque +4.0 lb·ft (+2.9 %).',
    ]);
  });

  it('describes a loss on average, with the minus sign and ±0.0 for nothing', () => {
    const loss = figures({
      peakPowerGain: { hp: -0.02, pct: -0.01 },
      peakTorqueGain: { lbft: -1.25, pct: -1 },
      averagePowerGainHp: -2,
      bands: [band(2000, -1), band(3000, -2), band(4000, -3)],
      peakPowerRpmShift: -250,
      largestLoss: { rpm: 4500, hp: -3.26 },
    });
    expect(describeResult(loss, 'hp-lbft')).toEqual([
      '±0.0 hp at peak (±0.0 %); on average −2.0 hp across 2,000–6,000 rpm.',
      'Peak torque −1.3 lb·ft (−1.0 %); peak power moved 250 rpm lower; it gives away up to 3.3 hp around 4,500 rpm.',
    ]);
  });

  it('says when most of the gain is low in the range', () => {
    const low = figures({ bands: [band(2000, 6), band(3000, 4), band(4000, 0.5), band(5000, 0)] });
    // Areas 6,000, 4,000, 500, 0 (total 10,500; 75 % = 7,875): from the bottom at the 3,000 band → "below 4,000".
    expect(describeResult(low, 'hp-lbft')[0]).toBe('+5.0 hp at peak (+3.2 %); most of the gain is below 4,000 rpm.');
  });

  it('sums up one run by its own sentences, several runs one line each, with cautions', () => {
    const one = [{ runId: 'b', sentences: ['+5.0 hp at peak.', 'Peak torque +4.0 lb·ft.'] }];
    expect(summarySentences(one, () => 'B', 'A', true, [])).toEqual(['+5.0 hp at peak.', 'Peak torque +4.0 lb·ft.']);
    const two = [...one, { runId: 'c', sentences: ['Most of the gain is above 4,000 rpm.', 'x'] }];
    const names: Record<string, string> = { b: 'Stage 1', c: 'Stage 2' };
    expect(summarySentences(two, (id) => names[id], 'Baseline', false, [{ code: 'DYNO_UNKNOWN' }])).toEqual([
      'Stage 1 against Baseline: +5.0 hp at peak.',
      'Stage 2 against Baseline: most of the gain is above 4,000 rpm.',
      'No stage in this comparison has two or more runs, so run-to-run spread is unknown; treat small differences with care.',
    ]);
    expect(summarySentences(one, () => 'B', 'A', true, [{ code: 'TEMPERATURE_APART' }]).at(-1)).toBe('Read these figures with the warnings below in mind.');
  });
});
