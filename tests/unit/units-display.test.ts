import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import Qty from 'js-quantities';
import { displayUnits, formatAirTemperature, formatBarometric, formatCc, formatCubicInches, powerGain, powerValue, torqueGain, torqueValue } from '@shared/units-display';

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

describe('power and torque in the shown unit (src/shared/units-display.ts)', () => {
  it('metric converts stored hp and lb·ft with NIST SP 811 factors', () => {
    const u = displayUnits('metric');
    expect(u.power).toBe('kW');
    expect(u.torque).toBe('N·m');
    // 1 hp = 745.6999 W (NIST SP 811, Appendix B.8)
    expect(u.p(100)).toBeCloseTo(74.56999, 4);
    // 1 lbf·ft = 1.355818 N·m (NIST SP 811, Appendix B.8)
    expect(u.t(100)).toBeCloseTo(135.5818, 3);
  });

  it('agrees with mathjs as an independent reference', () => {
    const u = displayUnits('kw-nm');
    expect(u.p(87.3)).toBeCloseTo(unit(87.3, 'hp').toNumber('kW'), 6);
    expect(u.t(66.1)).toBeCloseTo(unit(66.1, 'lbf ft').toNumber('N m'), 6);
  });

  it('imperial, the comparison option hp-lbft and an unknown value show what is stored', () => {
    for (const u of [displayUnits('imperial'), displayUnits('hp-lbft'), displayUnits(undefined)]) {
      expect(u.power).toBe('hp');
      expect(u.torque).toBe('lb·ft');
      expect(u.p(101.7)).toBe(101.7);
      expect(u.t(73.2)).toBe(73.2);
    }
  });

  it('formats figures and gains with one decimal and a sign', () => {
    const metric = displayUnits('metric');
    // 10 hp = 7.456999 kW (NIST SP 811) → "+7.5 kW"
    expect(powerGain(metric, 10)).toMatch(/^\+7\.5\s?kW$/);
    // 10 lbf·ft = 13.55818 N·m (NIST SP 811) → "+13.6 N·m"
    expect(torqueGain(metric, 10)).toMatch(/^\+13\.6\s?N·m$/);
    expect(powerValue(displayUnits('imperial'), 105.24)).toBe('105.2 hp');
    expect(torqueValue(metric, 50)).toBe('67.8 N·m'); // 50 × 1.355818 = 67.79 (NIST SP 811)
  });
});

describe('displacement in cm³ and in³ (src/shared/units-display.ts)', () => {
  it('1 in³ = 16.387064 cm³ exactly (NIST SP 811: 1 in = 2.54 cm exactly)', () => {
    expect(formatCubicInches(16.387064 * 96)).toBe('96.0 in³');
    expect(formatCubicInches(1640)).toBe(`${Qty('1640 cm^3').to('in^3').scalar.toFixed(1)} in³`);
    expect(formatCc(1640)).toBe('1,640 cm³');
  });
});
