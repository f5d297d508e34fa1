import { describe, expect, it } from 'vitest';
import { prepareReference, pullFigures, pullSpread, spreadText } from '@server/modules/dynos/bay-figures';
import { parseRunNotice } from '@server/lib/live/live-feed';
import type { EngineRun } from '@server/modules/comparisons/engine';

/**
 * The bay board's figures. Curves are flat-torque sweeps, so power is known in closed form:
 * hp = lb·ft × rpm / 5252.113 (1 hp = 550 ft·lbf/s, so the constant is 33 000 / 2π; NIST SP 811,
 * 2008, Appendix B), and the peak of a flat-torque sweep is at its top rpm.
 */
const K = 5252.113;
const RPM = Array.from({ length: 41 }, (_, i) => 2000 + i * 100); // 2,000 … 6,000 rpm

function flatRun(id: string, torque: number, extra: Partial<EngineRun> = {}): EngineRun {
  return {
    id,
    label: null,
    sequence: 1,
    status: 'ready',
    curve: { rpm: RPM, torqueLbft: RPM.map(() => torque), powerHp: RPM.map((r) => (torque * r) / K) },
    correctionStandard: null,
    correctionFactor: null,
    conditions: null,
    identityStatus: 'ok',
    createdAt: new Date('2026-12-02T10:00:00Z'),
    bike: { id: 'bike', make: 'Testmake', model: 'Own', year: 2020 },
    stage: null,
    session: null,
    ...extra,
  };
}

describe('bay pull figures', () => {
  it('reads peaks and the gain over the reference from the curves', () => {
    const reference = prepareReference(flatRun('ref', 100));
    const f = pullFigures(flatRun('p1', 105), reference);
    // 105 lb·ft at 6,000 rpm: 105 × 6000 / 5252.113 = 119.952 hp.
    expect(f.peakPowerHp).toBeCloseTo((105 * 6000) / K, 2);
    expect(f.peakTorqueLbft).toBeCloseTo(105, 6);
    // +5 lb·ft everywhere: +5 × 6000 / 5252.113 = +5.712 hp at peak, +5 lb·ft of torque.
    expect(f.gain!.peakPowerHp).toBeCloseTo((5 * 6000) / K, 2);
    expect(f.gain!.peakTorqueLbft).toBeCloseTo(5, 2);
    // Average gain over 2,000–6,000 rpm: 5 × (mean rpm 4,000) / 5252.113 = 3.808 hp.
    expect(f.gain!.averagePowerHp).toBeCloseTo((5 * 4000) / K, 1);
  });

  it('applies the stored correction factor and gives no gain for the reference itself or an unreadable run', () => {
    const corrected = pullFigures(flatRun('c', 100, { correctionFactor: 1.02, correctionStandard: 'sae-j1349' }), null);
    expect(corrected.peakPowerHp).toBeCloseTo(((100 * 6000) / K) * 1.02, 2);
    const refRun = flatRun('ref', 100);
    expect(pullFigures(refRun, prepareReference(refRun)).gain).toBeNull();
    const unread = pullFigures(flatRun('u', 100, { status: 'needs-mapping', curve: null }), prepareReference(refRun));
    expect(unread).toMatchObject({ curve: null, peakPowerHp: null, gain: null });
  });

  it('states the spread of the pulls as their peak-power range', () => {
    // 100, 100.5 and 101 lb·ft: peaks 114.240, 114.811, 115.383 hp; range 1 × 6000 / 5252.113 = 1.142 hp.
    const s = pullSpread([flatRun('a', 100), flatRun('b', 100.5), flatRun('c', 101)]);
    expect(s!.pulls).toBe(3);
    expect(s!.peakPowerSpreadHp).toBeCloseTo(6000 / K, 2);
    expect(s!.text).toBe('3 pulls within 1.1 hp');
    expect(pullSpread([flatRun('a', 100)])).toBeNull();
    expect(pullSpread([flatRun('a', 100), flatRun('u', 100, { status: 'failed', curve: null })])).toBeNull();
    expect(spreadText(4, 0.84)).toBe('4 pulls within 0.8 hp');
  });
});

describe('run notices', () => {
  it('reads the trigger’s payload and ignores anything else', () => {
    expect(parseRunNotice('{"shopId":"s","sessionId":"x","runId":"r","op":"insert"}')).toEqual({ shopId: 's', sessionId: 'x', runId: 'r', op: 'insert' });
    expect(parseRunNotice('{"sessionId":"x"}')).toBeNull();
    expect(parseRunNotice('not json')).toBeNull();
    expect(parseRunNotice(undefined)).toBeNull();
  });
});
