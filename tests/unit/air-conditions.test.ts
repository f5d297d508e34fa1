import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import Qty from 'js-quantities';
import { formatAirTemperature, formatBarometric } from '@/lib/air-conditions';

describe('air conditions in the shop’s units', () => {
  it('shows °F for imperial shops: 25 °C = 77 °F, 0 °C = 32 °F (by definition; NIST SP 811)', () => {
    expect(formatAirTemperature(25, 'imperial')).toBe('77.0 °F');
    expect(formatAirTemperature(0, 'imperial')).toBe('32.0 °F');
    expect(formatAirTemperature(-40, 'imperial')).toBe('\u221240.0 °F');
    expect(formatAirTemperature(21.25, 'metric')).toBe('21.3 °C');
  });

  it('agrees with mathjs for temperatures (independent reference)', () => {
    for (const c of [-12.5, 3, 18.4, 31.7]) {
      const f = unit(c, 'degC').toNumber('degF');
      expect(formatAirTemperature(c, 'imperial')).toBe(`${f < 0 ? '\u2212' : ''}${Math.abs(f).toFixed(1)} °F`);
    }
  });

  it('shows inHg for imperial shops: 99 kPa (SAE J1349 dry-air reference, from memory) ≈ 29.23 inHg', () => {
    expect(formatBarometric(99, 'imperial')).toBe('29.23 inHg');
    expect(formatBarometric(101.325, 'imperial')).toBe('29.92 inHg'); // one standard atmosphere ≈ 29.92 inHg (NIST SP 811)
    expect(formatBarometric(100.84, 'metric')).toBe('100.8 kPa');
    // js-quantities as an independent check of the factor (mathjs has no inHg).
    expect(formatBarometric(95.5, 'imperial')).toBe(`${Qty('95.5 kPa').to('inHg').scalar.toFixed(2)} inHg`);
  });

  it('says when a value was not recorded', () => {
    expect(formatAirTemperature(null, 'imperial')).toBe('not recorded');
    expect(formatBarometric(undefined, 'metric', '—')).toBe('—');
    expect(formatBarometric(Number.NaN, 'metric')).toBe('not recorded');
  });
});
