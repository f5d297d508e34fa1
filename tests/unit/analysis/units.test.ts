import { describe, expect, it } from 'vitest';
import * as math from 'mathjs';
import Qty from 'js-quantities';
import {
  HP_TORQUE_CONSTANT, KW_TORQUE_CONSTANT, NM_PER_LBFT, W_PER_HP, W_PER_PS,
  cTo, hpFromLbft, hpTo, kmhTo, kpaTo, lbftTo, powerToHp, pressureToKpa, speedToKmh, temperatureToC, torqueToLbft,
  parsePowerUnit, parseTorqueUnit, parsePressureUnit,
} from '@shared/analysis/index';

describe('conversion factors', () => {
  it('match NIST SP 811 (2008) Appendix B to the digits printed there', () => {
    // NIST SP 811 B.9: pound-force foot → newton meter 1.355 818 E+00
    expect(NM_PER_LBFT).toBeCloseTo(1.355818, 6);
    // NIST SP 811 B.9: horsepower (550 ft·lbf/s) → watt 7.456 999 E+02
    expect(W_PER_HP).toBeCloseTo(745.6999, 4);
    // Metric horsepower = 75 kgf·m/s, kgf = 9.80665 N exactly (NIST SP 811 B.9: 7.354 988 E+02)
    expect(W_PER_PS).toBe(735.49875);
    // 33 000 / 2π (1 hp = 33 000 ft·lbf/min), and 60 000 / 2π for kW and N·m
    expect(HP_TORQUE_CONSTANT).toBeCloseTo(5252.113, 3);
    expect(KW_TORQUE_CONSTANT).toBeCloseTo(9549.297, 3);
  });

  it('agree with mathjs as an independent reference (torque, power, speed, pressure, temperature)', () => {
    expect(torqueToLbft(100, 'nm')).toBeCloseTo(math.unit(100, 'N m').toNumber('lbf ft'), 10);
    expect(lbftTo(80, 'nm')).toBeCloseTo(math.unit(80, 'lbf ft').toNumber('N m'), 10);
    expect(torqueToLbft(10, 'kgfm')).toBeCloseTo(math.unit(10, 'kgf m').toNumber('lbf ft'), 10);
    expect(powerToHp(75, 'kw')).toBeCloseTo(math.unit(75, 'kW').toNumber('hp'), 6);
    expect(hpTo(100, 'kw')).toBeCloseTo(math.unit(100, 'hp').toNumber('kW'), 6);
    // mathjs reads "PS" as picosiemens, so metric horsepower is checked as 75 kgf·m/s.
    expect(powerToHp(100, 'ps')).toBeCloseTo(math.unit(7500, 'kgf m/s').toNumber('hp'), 6);
    expect(speedToKmh(60, 'mph')).toBeCloseTo(math.unit(60, 'mi/h').toNumber('km/h'), 10);
    expect(kmhTo(100, 'mph')).toBeCloseTo(math.unit(100, 'km/h').toNumber('mi/h'), 10);
    expect(pressureToKpa(14.7, 'psi')).toBeCloseTo(math.unit(14.7, 'psi').toNumber('kPa'), 5);
    expect(pressureToKpa(760, 'mmhg')).toBeCloseTo(math.unit(760, 'mmHg').toNumber('kPa'), 2);
    expect(pressureToKpa(1013, 'mbar')).toBeCloseTo(math.unit(1013, 'mbar').toNumber('kPa'), 10);
    expect(pressureToKpa(1013, 'hpa')).toBeCloseTo(math.unit(1013, 'hPa').toNumber('kPa'), 10);
    expect(temperatureToC(77, 'f')).toBeCloseTo(math.unit(77, 'degF').toNumber('degC'), 10);
    expect(cTo(25, 'k')).toBeCloseTo(math.unit(25, 'degC').toNumber('K'), 10);
  });

  it('agree with js-quantities where mathjs has no unit (inHg) and for hp', () => {
    // mathjs has no inHg; js-quantities does.
    expect(pressureToKpa(29.92, 'inhg')).toBeCloseTo(Qty('29.92 inHg').to('kPa').scalar, 3);
    expect(kpaTo(101.325, 'inhg')).toBeCloseTo(Qty('101.325 kPa').to('inHg').scalar, 3);
    expect(W_PER_HP).toBeCloseTo(Qty('1 hp').to('W').scalar, 4);
    expect(temperatureToC(60, 'f')).toBeCloseTo(Qty('60 tempF').to('tempC').scalar, 9);
  });

  it('round-trips every unit', () => {
    for (const u of ['lbft', 'nm', 'kgfm'] as const) expect(lbftTo(torqueToLbft(123.4, u), u)).toBeCloseTo(123.4, 10);
    for (const u of ['hp', 'kw', 'ps'] as const) expect(hpTo(powerToHp(98.7, u), u)).toBeCloseTo(98.7, 10);
  });

  it('hp and lb·ft curves cross at 5252 rpm (classic sanity fact, from hp = lb·ft × rpm / 5252)', () => {
    expect(hpFromLbft(100, 5252.113)).toBeCloseTo(100, 4);
    expect(hpFromLbft(100, 5000)).toBeLessThan(100);
    expect(hpFromLbft(100, 5500)).toBeGreaterThan(100);
    // kW = N·m × rpm / 9549.297: 100 N·m at 3000 rpm ≈ 31.416 kW (2π·3000/60·100 W)
    expect((100 * 3000) / KW_TORQUE_CONSTANT).toBeCloseTo((2 * Math.PI * 3000 * 100) / 60 / 1000, 9);
  });

  it('parses unit spellings found in headers', () => {
    expect(['ft-lb', 'lb-ft', 'ftlb', 'lb·ft', 'lbf ft'].map(parseTorqueUnit)).toEqual(['lbft', 'lbft', 'lbft', 'lbft', 'lbft']);
    expect(['Nm', 'N·m', 'kgm', 'kgf·m'].map(parseTorqueUnit)).toEqual(['nm', 'nm', 'kgfm', 'kgfm']);
    expect(['hp', 'whp', 'kW', 'PS', 'CV'].map(parsePowerUnit)).toEqual(['hp', 'hp', 'kw', 'ps', 'ps']);
    expect(['kPa', 'hPa', 'mbar', 'inHg', 'psi', 'mmHg'].map(parsePressureUnit)).toEqual(['kpa', 'hpa', 'mbar', 'inhg', 'psi', 'mmhg']);
    expect(parseTorqueUnit('rpm')).toBeUndefined();
  });
});
