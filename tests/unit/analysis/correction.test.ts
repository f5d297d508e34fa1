import { describe, expect, it } from 'vitest';
import {
  CORRECTION_STANDARDS, REFERENCE_CONDITIONS, AnalysisError, correctionFactor, dryAirPressureKpa,
  pressureToKpa, saturationVapourPressureKpa, temperatureToC,
} from '@server/analysis/index';

// CRC Handbook of Chemistry and Physics, "Vapor pressure of water from 0 to 370 °C" (kPa);
// values from memory.
const CRC_VAPOUR_KPA: [number, number][] = [
  [0, 0.6113], [5, 0.8726], [10, 1.2282], [15, 1.7057], [20, 2.3392], [25, 3.1697], [30, 4.2467], [35, 5.6286], [40, 7.3844],
];

describe('saturation vapour pressure (Buck 1981)', () => {
  it('is within 0.3 % of the CRC Handbook table from 0 to 40 °C', () => {
    for (const [t, crc] of CRC_VAPOUR_KPA) {
      expect(Math.abs(saturationVapourPressureKpa(t) / crc - 1)).toBeLessThan(0.003);
    }
  });
});

describe('correction factors', () => {
  it('are exactly 1 at each standard’s own reference conditions', () => {
    for (const [id, ref] of Object.entries(REFERENCE_CONDITIONS)) {
      const f = correctionFactor(id as never, { temperatureC: ref.temperatureC, baroKpa: ref.pressureKpa, humidityPct: 0 });
      expect(f).toBe(1);
    }
    // DIN 70020 uses total pressure, so humidity must not move it.
    expect(correctionFactor('din-70020', { temperatureC: 20, baroKpa: 101.3, humidityPct: 80 })).toBe(1);
    expect(correctionFactor('none', {})).toBe(1);
  });

  it('SAE J1349 (current form): 30 °C, 98.0 kPa, 50 % RH', () => {
    // Formula of SAE J1349 as quoted in issue 3: CF = 1.176·[(99/Pd)·√(T/298)] − 0.176, with
    // Pd = 98.0 − 0.5 × 4.2467 (CRC vapour pressure at 30 °C) = 95.8767 kPa, T = 303 K.
    // Hand calculation (independent of the code): 1.04846.
    expect(correctionFactor('sae-j1349', { temperatureC: 30, baroKpa: 98, humidityPct: 50 })).toBeCloseTo(1.04846, 3);
  });

  it('SAE J1349 (1990 form) and ISO 1585 for the same air', () => {
    // 1.18·r − 0.18 (SAE J1349 June 1990, as quoted in issue 3); hand calculation 1.04862.
    expect(correctionFactor('sae-j1349-1990', { temperatureC: 30, baroKpa: 98, humidityPct: 50 })).toBeCloseTo(1.04862, 3);
    // ISO 1585 / EEC 80/1269: (99/Pd)^1.2·(T/298)^0.6; hand calculation 1.04965.
    expect(correctionFactor('iso-1585', { temperatureC: 30, baroKpa: 98, humidityPct: 50 })).toBeCloseTo(1.04965, 3);
  });

  it('DIN 70020: 30 °C, 990 mbar (total pressure, no humidity)', () => {
    // DIN 70020: CF = (1013/p)·√(T/293), p in mbar; hand calculation (1013/990)·√(303/293) = 1.04055.
    expect(correctionFactor('din-70020', { temperatureC: 30, baroKpa: pressureToKpa(990, 'mbar'), humidityPct: 60 })).toBeCloseTo(1.04055, 3);
  });

  it('SAE J607: 90 °F, 29.0 inHg, 30 % RH', () => {
    // SAE J607: CF = (29.92/Pd)·√((T+460)/520), Pd dry in inHg. Hand calculation with
    // Pd = 29.0 − 0.3 × 4.8162 kPa / 3.38638 = 28.5733 inHg: 1.07691.
    const f = correctionFactor('sae-j607', { temperatureC: temperatureToC(90, 'f'), baroKpa: pressureToKpa(29.0, 'inhg'), humidityPct: 30 });
    expect(f).toBeCloseTo(1.07691, 3);
  });

  it('SAE J607 reads about 4 % above SAE J1349 for the same run (common practice, no published source)', () => {
    const air = { temperatureC: 25, baroKpa: 99, humidityPct: 0 };
    expect(correctionFactor('sae-j607', air)).toBeGreaterThan(1.035);
    expect(correctionFactor('sae-j607', air)).toBeLessThan(1.045);
  });

  it('moves the right way: hotter or thinner air gives a factor above 1', () => {
    expect(correctionFactor('sae-j1349', { temperatureC: 35, baroKpa: 99 })).toBeGreaterThan(1);
    expect(correctionFactor('sae-j1349', { temperatureC: 10, baroKpa: 102 })).toBeLessThan(1);
    expect(dryAirPressureKpa(100, 25, 100)).toBeCloseTo(100 - saturationVapourPressureKpa(25), 12);
  });

  it('throws CONDITIONS_MISSING without temperature or pressure', () => {
    for (const s of CORRECTION_STANDARDS.filter((x) => x.id !== 'none')) {
      expect(() => correctionFactor(s.id, { temperatureC: 20 })).toThrow(AnalysisError);
      try {
        correctionFactor(s.id, { baroKpa: 99 });
      } catch (e) {
        expect((e as AnalysisError).code).toBe('CONDITIONS_MISSING');
      }
    }
  });
});
