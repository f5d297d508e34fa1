import { describe, expect, it } from 'vitest';
import { vinCheckDigit, vinProblem } from '@shared/vin';

describe('VIN check digit (49 CFR Part 565)', () => {
  it('accepts the worked example 1M8GDM9AXKP042788 (check digit X)', () => {
    // The example VIN reproduced with the 49 CFR 565 check-digit description (from memory).
    expect(vinCheckDigit('1M8GDM9AXKP042788')).toBe('X');
    expect(vinProblem('1M8GDM9AXKP042788')).toBeNull();
  });

  it('accepts the all-ones VIN, whose weighted sum is 89 → 89 mod 11 = 1', () => {
    // Weights 8,7,6,5,4,3,2,10,0,9,8,7,6,5,4,3,2 sum to 89 (49 CFR 565.15 weight table).
    expect(vinCheckDigit('11111111111111111')).toBe('1');
    expect(vinProblem('11111111111111111')).toBeNull();
  });

  it('rejects a wrong check digit, a wrong length and the letters I, O and Q', () => {
    expect(vinProblem('1M8GDM9A1KP042788')).toBe('check-digit');
    expect(vinProblem('1M8GDM9AXKP04278')).toBe('length');
    expect(vinProblem('1M8GDM9AXKP04278O')).toBe('characters');
    expect(vinProblem('IM8GDM9AXKP042788')).toBe('characters');
  });

  it('ignores case and surrounding spaces', () => {
    expect(vinProblem('  1m8gdm9axkp042788 ')).toBeNull();
  });
});
