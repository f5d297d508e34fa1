import { describe, expect, it } from 'vitest';
import type { ComparisonPreview } from '@shared/schemas/comparison';
import { displayUnits } from '@shared/units-display';
import { curvesCsv } from '@/features/comparisons/lib/display';

// A hand-made preview with only what the CSV reads; the figures are invented.
const preview = {
  runs: [
    { runId: 'a', name: 'Baseline · pull 2', fileName: 'stock-2.csv' },
    { runId: 'b', name: 'Stage 1 · pull 5', fileName: 'day.log · pull 2 of 3' },
    { runId: 'c', name: 'Labelled run', fileName: null },
  ],
  curves: {
    rpm: [3000, 3100],
    runs: [
      { runId: 'a', powerHp: [50, 51.5], torqueLbft: [87.5, 87.3] },
      { runId: 'b', powerHp: [55, null], torqueLbft: [96.3, null] },
      { runId: 'c', powerHp: [1, 2], torqueLbft: [3, 4] },
    ],
  },
} as unknown as ComparisonPreview;

describe('comparison curves CSV', () => {
  it('names each column by the run’s one name with its file, as on every screen', () => {
    const [header, first, second] = curvesCsv(preview, displayUnits('imperial')).trimEnd().split('\r\n');
    expect(header).toBe(
      '"rpm","Baseline · pull 2 (stock-2.csv) power (hp)","Baseline · pull 2 (stock-2.csv) torque (lb·ft)","Stage 1 · pull 5 (day.log · pull 2 of 3) power (hp)","Stage 1 · pull 5 (day.log · pull 2 of 3) torque (lb·ft)","Labelled run power (hp)","Labelled run torque (lb·ft)"',
    );
    expect(first).toBe('3000,50,87.5,55,96.3,1,3');
    // A run without data at an rpm leaves its cells empty.
    expect(second).toBe('3100,51.5,87.3,,,2,4');
  });
});
