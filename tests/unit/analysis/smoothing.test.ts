import { describe, expect, it } from 'vitest';
import { savitzkyGolayCoefficients, smoothSavitzkyGolay } from '@shared/analysis/index';

// Published smoothing coefficients (quadratic/cubic), Savitzky & Golay (1964) Table I as corrected
// by Steinier, Termonia & Deltour (1972). Values typed from memory.
const TABLE: [number, number[], number][] = [
  [5, [-3, 12, 17, 12, -3], 35],
  [7, [-2, 3, 6, 7, 6, 3, -2], 21],
  [9, [-21, 14, 39, 54, 59, 54, 39, 14, -21], 231],
  [11, [-36, 9, 44, 69, 84, 89, 84, 69, 44, 9, -36], 429],
];

describe('Savitzky–Golay coefficients by least squares', () => {
  for (const [window, numerators, norm] of TABLE) {
    it(`${window}-point quadratic matches the published table`, () => {
      const c = savitzkyGolayCoefficients(window, 2);
      numerators.forEach((n, i) => expect(c[i]).toBeCloseTo(n / norm, 12));
      // Quadratic and cubic fits give the same centre coefficients (symmetry) — property of the method.
      const cubic = savitzkyGolayCoefficients(window, 3);
      numerators.forEach((n, i) => expect(cubic[i]).toBeCloseTo(n / norm, 10));
    });
  }

  it('reproduces any quadratic exactly, including the off-centre end fits', () => {
    const q = Array.from({ length: 30 }, (_, i) => 3 + 0.5 * i - 0.07 * i * i);
    const s = smoothSavitzkyGolay(q, 7);
    s.forEach((v, i) => expect(v).toBeCloseTo(q[i], 9));
  });

  it('reduces white noise on a straight line', () => {
    let seed = 7;
    const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647) - 0.5;
    const clean = Array.from({ length: 200 }, (_, i) => i * 0.1);
    const noisy = clean.map((v) => v + rnd());
    const sm = smoothSavitzkyGolay(noisy, 9);
    const err = (a: number[]) => Math.sqrt(a.reduce((s, v, i) => s + (v - clean[i]) ** 2, 0) / a.length);
    expect(err(sm)).toBeLessThan(err(noisy) * 0.7);
  });

  it('window 0/1 or shorter than the data is handled', () => {
    expect(smoothSavitzkyGolay([1, 2, 3], 1)).toEqual([1, 2, 3]);
    expect(smoothSavitzkyGolay([1, 5, 2, 8], 9).length).toBe(4);
  });
});
