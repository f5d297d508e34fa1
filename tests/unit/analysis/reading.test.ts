import { describe, expect, it } from 'vitest';
import { AnalysisError, analyzeBuffer, type AnalysisResult } from '@shared/analysis/index';
import { type RunFileFormat, modelPowerHp, modelTorqueLbft, syntheticRunFile } from '@server/db/synthetic-runs';

const enc = (s: string) => new TextEncoder().encode(s);
// Low noise so peak positions are defined by the model, not by noise.
const QUIET = { seed: 5, rpmNoise: 2, torqueNoise: 0.05 };
// A peakier invented engine so the torque peak rpm is well defined.
const PEAKY = { ...QUIET, engine: { peakTorqueLbft: 90, peakTorqueRpm: 3600, falloff: 0.08 } };

function expectMatchesModel(r: AnalysisResult, run: ReturnType<typeof syntheticRunFile>['run']) {
  // Known answers of the invented engine model (dense evaluation of the analytic curve).
  expect(r.peakPower.hp).toBeCloseTo(run.truth.peakPower.hp, 0);
  expect(Math.abs(r.peakPower.hp / run.truth.peakPower.hp - 1)).toBeLessThan(0.005);
  expect(Math.abs(r.peakTorque.lbft / run.truth.peakTorque.lbft - 1)).toBeLessThan(0.005);
  expect(Math.abs(r.peakTorque.rpm - run.truth.peakTorque.rpm)).toBeLessThanOrEqual(150);
  expect(r.rpmRange[0]).toBeGreaterThanOrEqual(run.truth.startRpm - 50);
  expect(r.rpmRange[1]).toBeLessThanOrEqual(run.truth.endRpm + 50);
  expect(r.rpmRange[1]).toBeGreaterThanOrEqual(run.truth.endRpm - 100);
  // The resampled curve follows the model at every grid point (within 1 %).
  r.curve.rpm.forEach((rpm, i) => {
    if (rpm < run.truth.startRpm + 100) return;
    expect(Math.abs(r.curve.torqueLbft[i] / modelTorqueLbft(run.engine, rpm) - 1)).toBeLessThan(0.01);
    expect(Math.abs(r.curve.powerHp[i] / modelPowerHp(run.engine, rpm) - 1)).toBeLessThan(0.01);
  });
}

const FORMATS: [string, RunFileFormat][] = [
  ['comma, brackets, LF, UTF-8', {}],
  ['semicolon, decimal comma, N·m/kW, CRLF, UTF-8 BOM', { delimiter: ';', decimalComma: true, torqueUnit: 'nm', powerUnit: 'kw', lineEnding: '\r\n', encoding: 'utf-8-bom' }],
  ['tab, units row, CR, UTF-16 LE BOM', { delimiter: '\t', headerStyle: 'units-row', lineEnding: '\r', encoding: 'utf-16le' }],
  ['tab, decimal comma, UTF-16 BE BOM, PS', { delimiter: '\t', decimalComma: true, powerUnit: 'ps', encoding: 'utf-16be' }],
  ['pipe, abbreviated names, lambda', { delimiter: '|', headerStyle: 'abbreviated', columns: ['rpm', 'torque', 'power', 'lambda'] }],
  ['parentheses, quoted thousands, Latin-1, extra channels', { headerStyle: 'parentheses', quoteThousands: true, encoding: 'latin1', columns: ['time', 'rpm', 'torque', 'power', 'speed', 'map', 'iat', 'afr'] }],
  ['abbreviated N·m/kW', { headerStyle: 'abbreviated', torqueUnit: 'nm', powerUnit: 'kw' }],
  ['kgf·m torque only', { torqueUnit: 'kgfm', columns: ['rpm', 'torque'] }],
  ['power only, kW', { powerUnit: 'kw', columns: ['rpm', 'power'] }],
];

describe('reading every supported format', () => {
  for (const [label, format] of FORMATS) {
    it(label, () => {
      const { run, bytes } = syntheticRunFile(PEAKY, format);
      const r = analyzeBuffer(bytes);
      expectMatchesModel(r, run);
      const both = !format.columns || (format.columns.includes('torque') && format.columns.includes('power'));
      expect(r.identity.status).toBe(both ? 'ok' : 'derived');
      expect(r.units.torque).toBe(format.columns && !format.columns.includes('torque') ? null : (format.torqueUnit ?? 'lbft'));
    });
  }

  it('isolates the sweep from the steady lead-in and the deceleration tail', () => {
    const { run, bytes } = syntheticRunFile({ ...QUIET, leadInSeconds: 5, tailSeconds: 3, sampleHz: 40 });
    const r = analyzeBuffer(bytes);
    const sweepPoints = run.truth.sweepEnd - run.truth.sweepStart + 1;
    // At 40 Hz and 500 rpm/s the rise is 12.5 rpm per sample; the jitter tolerance (40 rpm) leaves a few samples ambiguous at each end.
    expect(Math.abs(r.points - sweepPoints)).toBeLessThanOrEqual(6);
    expect(r.droppedPoints).toBe(run.samples.length - r.points);
    expect(r.droppedPoints).toBeGreaterThan(5 * 40);
  });

  it('resamples to the requested grid and applies no smoothing with smooth 0', () => {
    const { bytes } = syntheticRunFile(QUIET);
    const r = analyzeBuffer(bytes, { gridRpm: 100, smooth: 0 });
    expect(r.curve.rpm.every((v) => v % 100 === 0)).toBe(true);
    expect(r.curve.rpm[1] - r.curve.rpm[0]).toBe(100);
  });

  it('hp and lb·ft cross at 5252 rpm on an analysed curve', () => {
    const { bytes } = syntheticRunFile({ ...QUIET, endRpm: 6500 });
    const r = analyzeBuffer(bytes, { gridRpm: 10 });
    const i = r.curve.rpm.indexOf(5250);
    // Within 0.1 %: at 5250 rpm hp = lb·ft × 5250/5252.113.
    expect(Math.abs(r.curve.powerHp[i] / r.curve.torqueLbft[i] - 1)).toBeLessThan(0.001);
    const below = r.curve.rpm.indexOf(4500);
    const above = r.curve.rpm.indexOf(6000);
    expect(r.curve.powerHp[below]).toBeLessThan(r.curve.torqueLbft[below]);
    expect(r.curve.powerHp[above]).toBeGreaterThan(r.curve.torqueLbft[above]);
  });

  it('reads preamble conditions with their units (°F, inHg, %), colon and delimited styles', () => {
    const head = [
      'Shop: Copperline Cycle Works',
      'Date: 2031-04-12 10:40',
      'Ambient temp: 77 °F',
      'Barometer: 29.53 inHg',
      'Humidity: 35 %',
      'Operator: Dana',
      'Notes: baseline, stock air box',
      '',
    ].join('\n');
    const { text } = syntheticRunFile(QUIET);
    const r = analyzeBuffer(enc(head + text));
    // 77 °F = 25 °C; 29.53 inHg × 3.38638 = 99.9998 kPa (NIST SP 811 factor).
    expect(r.conditions.temperatureC).toBeCloseTo(25, 9);
    expect(r.conditions.baroKpa).toBeCloseTo(29.53 * 3.38638, 6);
    expect(r.conditions.humidityPct).toBe(35);
    expect(r.conditions.date).toBe('2031-04-12 10:40');
    expect(r.conditions.operator).toBe('Dana');
    expect(r.conditions.notes).toBe('baseline, stock air box');
    expect(r.conditions.shop).toBe('Copperline Cycle Works');

    const semi = syntheticRunFile(QUIET, {
      delimiter: ';', decimalComma: true, preamble: 'delimited', conditions: { temperatureC: 18.5, baroKpa: 101.1, humidityPct: 62 },
    });
    const r2 = analyzeBuffer(semi.bytes);
    expect(r2.conditions.temperatureC).toBe(18.5);
    expect(r2.conditions.baroKpa).toBeCloseTo(101.1, 9);
    expect(r2.conditions.humidityPct).toBe(62);
  });

  it('applies a correction from the preamble; options override the preamble', () => {
    const { bytes } = syntheticRunFile(QUIET, { preamble: 'colon', conditions: { temperatureC: 30, baroKpa: 98, humidityPct: 50 } });
    const uncorrected = analyzeBuffer(bytes);
    const corrected = analyzeBuffer(bytes, { correction: 'sae-j1349' });
    // Hand-worked SAE J1349 factor for 30 °C / 98 kPa / 50 % (see correction.test.ts): 1.04846.
    expect(corrected.correction.factor).toBeCloseTo(1.04846, 3);
    expect(corrected.peakPower.hp).toBeCloseTo(uncorrected.peakPower.hp * corrected.correction.factor, 9);
    // The curve stays uncorrected so another standard can be applied later.
    expect(corrected.curve.powerHp).toEqual(uncorrected.curve.powerHp);
    const overridden = analyzeBuffer(bytes, { correction: 'sae-j1349', conditions: { temperatureC: 25, baroKpa: 99, humidityPct: 0 } });
    expect(overridden.correction.factor).toBe(1);
    expect(() => analyzeBuffer(syntheticRunFile(QUIET).bytes, { correction: 'din-70020' })).toThrow(/needs the air temperature/);
  });

  it('recognises header variants', () => {
    const rows = syntheticRunFile(QUIET, { headerStyle: 'none', columns: ['rpm', 'torque', 'power'] }).text;
    for (const header of ['Engine RPM,Torque (ft-lb),Power (hp)', 'rpm,tq_ftlb,hp', 'Engine speed,Torque [lbft],Power [HP]', 'RPM,TQ,HP']) {
      const r = analyzeBuffer(enc(`${header}\n${rows}`));
      expect(r.units).toEqual({ torque: 'lbft', power: 'hp' });
      expect(r.identity.status).toBe('ok');
    }
    const unitsRow = analyzeBuffer(enc(`RPM,Torque,Power\nrpm,Nm,kW\n${syntheticRunFile(QUIET, { headerStyle: 'none', columns: ['rpm', 'torque', 'power'], torqueUnit: 'nm', powerUnit: 'kw' }).text}`));
    expect(unitsRow.units).toEqual({ torque: 'nm', power: 'kw' });
    expect(unitsRow.headerSignature).toBe('rpm[rpm]|torque[nm]|power[kw]');
  });

  it('gives the same header signature for the same layout and a different one otherwise', () => {
    const a = analyzeBuffer(syntheticRunFile({ seed: 1 }).bytes);
    const b = analyzeBuffer(syntheticRunFile({ seed: 2 }, { lineEnding: '\r\n' }).bytes);
    const c = analyzeBuffer(syntheticRunFile({ seed: 1 }, { torqueUnit: 'nm' }).bytes);
    expect(a.headerSignature).toBe(b.headerSignature);
    expect(a.headerSignature).not.toBe(c.headerSignature);
  });

  it('reports lambda channels converted to AFR and AFR channels as they are', () => {
    const r = analyzeBuffer(syntheticRunFile(QUIET, { columns: ['rpm', 'torque', 'power', 'lambda'] }).bytes);
    const keys = Object.keys(r.curve.afr);
    expect(keys).toEqual(['Lambda Front [λ] (AFR)', 'Lambda Rear [λ] (AFR)']);
    // The generator writes AFR / 14.7 as lambda; full throttle AFR is about 13.1.
    const mid = Math.floor(r.curve.rpm.length / 2);
    expect(r.curve.afr[keys[0]][mid]).toBeCloseTo(13.1, 0);
  });

  it('asks for a mapping when columns are not recognisable, and accepts one', () => {
    const rows = syntheticRunFile(QUIET, { headerStyle: 'none', columns: ['time', 'rpm', 'torque', 'power'] }).text;
    const file = enc(`A,B,C,D\n${rows}`);
    // Columns found by values: the pair obeying power = torque × rpm / 5252 is recognised.
    const guessed = analyzeBuffer(file);
    expect(guessed.warnings.map((w) => w.code)).toContain('COLUMNS_GUESSED');
    expect(guessed.confidence).toBeLessThan(1);
    expect(guessed.columns.torque).toBe('C');

    const onlyOne = enc(`A,B,C\n${syntheticRunFile(QUIET, { headerStyle: 'none', columns: ['time', 'rpm', 'torque'] }).text}`);
    try {
      analyzeBuffer(onlyOne);
      expect.unreachable();
    } catch (e) {
      const err = e as AnalysisError;
      expect(err.code).toBe('NEEDS_MAPPING');
      const d = err.details as { headers: string[]; previewRows: string[][]; suggestions: { rpm?: string }; headerSignature: string };
      expect(d.headers).toEqual(['A', 'B', 'C']);
      expect(d.previewRows.length).toBeGreaterThan(3);
      expect(d.suggestions.rpm).toBe('B');
      expect(d.headerSignature).toBe('a|b|c');
    }
    const mapped = analyzeBuffer(onlyOne, { mapping: { rpm: 'B', torque: { column: 'C', unit: 'lbft' } } });
    expect(mapped.identity.status).toBe('derived');
    expect(mapped.confidence).toBe(1);
    expect(() => analyzeBuffer(onlyOne, { mapping: { rpm: 'Z', torque: { column: 'C', unit: 'lbft' } } })).toThrow(/not in the file/);
  });

  it('skips blank cells with a warning and ignores trailer text lines', () => {
    const lines = syntheticRunFile(QUIET, { columns: ['rpm', 'torque', 'power'] }).text.trimEnd().split('\n');
    lines[60] = lines[60].replace(/,[^,]*$/, ',');
    lines.push('End of run');
    const r = analyzeBuffer(enc(lines.join('\n')));
    expect(r.warnings.map((w) => w.code)).toContain('ROWS_SKIPPED');
  });
});
