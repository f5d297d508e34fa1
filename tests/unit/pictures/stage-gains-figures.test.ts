import { describe, expect, it } from 'vitest';
import type { TimelineGain, TimelineStage } from '@shared/schemas/comparison';
import { stageGainBars, stageGainRows } from '@/features/bikes/components/stage-gains/stage-gains-figures';

// Invented build, hand-computed expectations (cost spans follow the rule in
// server/modules/comparisons/stage-cost.ts: a gain from A to B is paid by every stage after A up to B).
const gain = (hp: number, within = false): TimelineGain => ({ peakPowerHp: hp, peakPowerPct: 0, peakTorqueLbft: 0, averagePowerHp: hp, areaPct: 0, withinRepeatability: { peakPower: within, averagePower: null } });
const ref = (hp: number) => ({ peakPowerHp: hp, peakPowerRpm: 5200, peakTorqueLbft: 100, peakTorqueRpm: 3400, correction: 'sae-j1349' as const });
function stage(p: Partial<TimelineStage> & Pick<TimelineStage, 'stageId' | 'name' | 'costCents' | 'cumulativeCostCents'>): TimelineStage {
  return { position: 0, date: null, referenceRunId: null, reference: null, parts: [], vsPrevious: null, vsBaseline: null, costPerHp: null, cumulativeCostPerHp: null, repeatability: null, ...p };
}

// Baseline 80 hp; Stage 1 (exhaust, $1,200) → 86 hp; Intake ($300, not measured); Stage 2 ($900) → 90 hp.
const stages: TimelineStage[] = [
  stage({ stageId: 'b', name: 'Baseline', costCents: 0, cumulativeCostCents: 0, reference: ref(80), repeatability: { stageId: 'b', stageName: 'Baseline', runs: 3, peakPowerSpreadHp: 0.8, averagePowerSpreadHp: 0.5 } as never }),
  // 120 000 cents ÷ 6 hp = 20 000 cents per hp.
  stage({ stageId: 's1', name: 'Stage 1', costCents: 120_000, cumulativeCostCents: 120_000, reference: ref(86), vsPrevious: gain(6), vsBaseline: gain(6), costPerHp: { peakCents: 20_000, averageCents: 20_000 }, cumulativeCostPerHp: { peakCents: 20_000, averageCents: 20_000 } }),
  stage({ stageId: 'i', name: 'Intake', costCents: 30_000, cumulativeCostCents: 150_000 }),
  // Over Stage 1: (30 000 + 90 000) ÷ 4 hp = 30 000 per hp; since baseline 240 000 ÷ 10 = 24 000.
  stage({ stageId: 's2', name: 'Stage 2', costCents: 90_000, cumulativeCostCents: 240_000, reference: ref(90), vsPrevious: gain(4, true), vsBaseline: gain(10), costPerHp: { peakCents: 30_000, averageCents: 30_000 }, cumulativeCostPerHp: { peakCents: 24_000, averageCents: 24_000 } }),
];

describe('gains by stage: one figure per cell', () => {
  const rows = stageGainRows(stages);
  it('prices each gain with the work since the previous measured stage, an unmeasured stage included', () => {
    expect(rows.map((r) => r.gainCostCents)).toEqual([null, 120_000, null, 120_000]);
    expect(rows.map((r) => r.totalCostCents)).toEqual([null, 120_000, null, 240_000]);
    expect(rows.map((r) => r.costPerHpCents)).toEqual([null, 20_000, null, 30_000]);
    expect(rows.map((r) => r.totalCostPerHpCents)).toEqual([null, 20_000, null, 24_000]);
  });
  it('keeps reference figures apart and leaves an unmeasured stage empty', () => {
    expect(rows.map((r) => r.peakPowerHp)).toEqual([80, 86, null, 90]);
    expect(rows.map((r) => r.measured)).toEqual([true, true, false, true]);
    expect(rows[0].spreadHp).toBe(0.8);
    expect(rows[1].spreadHp).toBeNull();
  });
});

describe('gains chart bars', () => {
  it('one bar per measured step, then the whole build since the baseline', () => {
    const bars = stageGainBars(stages);
    expect(bars.map((b) => [b.label, b.gainHp, b.costPerHpCents, b.isTotal])).toEqual([
      ['Stage 1', 6, 20_000, false],
      ['Stage 2', 4, 30_000, false],
      ['Whole build since Baseline', 10, 24_000, true],
    ]);
    expect(bars[1].withinSpread).toBe(true);
  });
  it('a single step is already the whole build; no measured step, no bars', () => {
    expect(stageGainBars(stages.slice(0, 2)).map((b) => b.key)).toEqual(['s1']);
    expect(stageGainBars(stages.slice(0, 1))).toEqual([]);
  });
  it('a loss stays negative and has no cost per hp', () => {
    const loss = stages.slice(0, 2).map((s) => (s.stageId === 's1' ? { ...s, vsPrevious: gain(-1.5), costPerHp: { peakCents: null, averageCents: null } } : s));
    expect(stageGainBars(loss)).toMatchObject([{ gainHp: -1.5, costPerHpCents: null }]);
  });
});
