import { describe, expect, it } from 'vitest';
import {
  ANALYSIS_WARNING_CODES,
  AnalysisError,
  type AnalysisResult,
  analyzeBuffer,
  analyzeBufferPulls,
} from '@shared/analysis/index';
import {
  type HeaderLanguage,
  type RunFileFormat,
  type SyntheticGlitch,
  type SyntheticRun,
  modelPeaks,
  modelPowerHp,
  modelTorqueLbft,
  renderRunFile,
  syntheticLog,
  threePullLog,
  syntheticRun,
  withGlitches,
} from '@server/db/synthetic-runs';

/**
 * Expected answers come from the generator's own closed-form torque curve (an invented engine),
 * never from the engine under test: hp = lb·ft × rpm / 5252.113, because 1 hp = 550 ft·lbf/s =
 * 33 000 ft·lbf/min and one revolution is 2π rad, so 33 000 / 2π = 5252.113 (NIST SP 811, 2008,
 * Appendix B: 1 hp = 745.6999 W, 1 lbf·ft = 1.355818 N·m).
 */
const HP_CONSTANT = 33_000 / (2 * Math.PI);
const QUIET = { seed: 7, rpmNoise: 2, torqueNoise: 0.05 };
const codes = (r: AnalysisResult) => r.warnings.map((w) => w.code);
const within1pct = (value: number, truth: number) => Math.abs(value / truth - 1) < 0.01;

function expectModelPeaks(r: AnalysisResult, truth: SyntheticRun['truth']) {
  expect(Math.abs(r.peakPower.hp / truth.peakPower.hp - 1)).toBeLessThan(0.01);
  expect(Math.abs(r.peakTorque.lbft / truth.peakTorque.lbft - 1)).toBeLessThan(0.01);
  expect(r.rpmRange[1]).toBeLessThanOrEqual(truth.endRpm + 50);
}

describe('the independent model', () => {
  it('power is lb·ft × rpm / 5252.113 (1 hp = 550 ft·lbf/s)', () => {
    expect(HP_CONSTANT).toBeCloseTo(5252.113, 3);
    const engine = { peakTorqueLbft: 96, peakTorqueRpm: 3400, falloff: 0.035 };
    for (const rpm of [2000, 3400, 5252.113, 5800]) {
      expect(Math.abs(modelPowerHp(engine, rpm) / ((modelTorqueLbft(engine, rpm) * rpm) / 5252.113) - 1)).toBeLessThan(1e-6);
    }
  });
});

describe('glitch rejection', () => {
  const cases: [string, SyntheticGlitch[]][] = [
    ['drop-outs to zero', [{ at: 70, kind: 'dropout' }, { at: 120, kind: 'dropout', length: 2 }]],
    ['doubled readings with a torque spike', [{ at: 90, kind: 'double', torqueSpike: true }, { at: 150, kind: 'double', length: 4 }]],
    ['halved readings', [{ at: 100, kind: 'half', length: 3 }]],
    ['single-sample spikes with torque spikes', [{ at: 80, kind: 'spike', torqueSpike: true }, { at: 140, kind: 'spike', torqueSpike: true }]],
  ];
  for (const [label, glitches] of cases) {
    it(`${label}: dropped with GLITCHES_DROPPED, peaks within 1 % of the model`, () => {
      const run = withGlitches(syntheticRun(QUIET), glitches);
      const r = analyzeBuffer(renderRunFile(run).bytes);
      expectModelPeaks(r, run.truth);
      const injected = glitches.reduce((n, g) => n + (g.length ?? 1), 0);
      expect(r.glitches.dropped).toBeGreaterThanOrEqual(injected);
      expect(r.glitches.dropped).toBeLessThanOrEqual(injected + 4);
      expect(r.review).toBe(false);
      const w = r.warnings.find((x) => x.code === 'GLITCHES_DROPPED');
      expect(w?.message).toMatch(/lines? \d+/);
      // Ranges name the file lines: data row k is on line k + 2 (header on line 1, rows 0-based).
      const firstLine = r.glitches.ranges[0].lines[0];
      expect(firstLine).toBe(Math.min(...glitches.map((g) => g.at)) + 2);
    });
  }

  it('a pickup reading double near the top can no longer double the peak (the 93 hp → 184.7 hp at 11 050 rpm case)', () => {
    // An invented ~93 hp engine; the pickup reads double for 12 samples near the top of the pull.
    const engine = { peakTorqueLbft: 92, peakTorqueRpm: 5000, falloff: 0.04 };
    const clean = syntheticRun({ ...QUIET, engine, startRpm: 2500, endRpm: 5800 });
    expect(clean.truth.peakPower.hp).toBeGreaterThan(85);
    const top = clean.truth.sweepEnd - 20;
    const run = withGlitches(clean, [{ at: top, kind: 'double', length: 12 }]);
    // The glitch really is in the file: the raw maximum is about twice the true peak.
    expect(Math.max(...run.samples.map((s) => s.powerHp))).toBeGreaterThan(1.8 * clean.truth.peakPower.hp);
    const r = analyzeBuffer(renderRunFile(run).bytes);
    expectModelPeaks(r, clean.truth);
    expect(r.peakPower.rpm).toBeLessThanOrEqual(5800);
    expect(codes(r)).toContain('GLITCHES_DROPPED');
  });

  it('more than 10 % glitches marks the run for review (GLITCHES_REVIEW) instead of silently smoothing', () => {
    const clean = syntheticRun(QUIET);
    const glitches: SyntheticGlitch[] = [];
    for (let i = clean.truth.sweepStart + 3; i < clean.truth.sweepEnd; i += 6) glitches.push({ at: i, kind: 'dropout' });
    const r = analyzeBuffer(renderRunFile(withGlitches(clean, glitches)).bytes);
    expect(r.review).toBe(true);
    expect(r.glitches.review).toBe(true);
    expect(codes(r)).toContain('GLITCHES_REVIEW');
    expect(codes(r)).toContain('GLITCHES_DROPPED');
  });

  it('a clean run drops nothing and warns nothing new', () => {
    const run = syntheticRun(QUIET);
    const r = analyzeBuffer(renderRunFile(run).bytes);
    expect(r.glitches.droppedInLog).toBe(0);
    expect(r.review).toBe(false);
    expect(r.warnings).toEqual([]);
  });
});

describe('several pulls in one log', () => {
  const log = threePullLog(3);
  const bytes = renderRunFile(log).bytes;

  it('splits the log into its three pulls, in time order, the aborted one marked partial', () => {
    const { pulls, main } = analyzeBufferPulls(bytes);
    expect(pulls).toHaveLength(3);
    expect(main).toBe(1);
    pulls.forEach((p, i) => {
      expect(p.pull.index).toBe(i);
      expect(p.pull.count).toBe(3);
      expect(codes(p)).toContain('PULLS_FOUND');
      // Each pull covers its own sweep, and its peaks match the model over the rpm it covers (a
      // partial pull peaks at its top, so the covered range matters).
      expect(p.rpmRange[0]).toBeLessThanOrEqual(log.pulls[i].startRpm + 100);
      expect(p.rpmRange[1]).toBeGreaterThanOrEqual(log.pulls[i].endRpm - 100);
      const truth = modelPeaks(log.engine, p.rpmRange[0], p.rpmRange[1]);
      expect(within1pct(p.peakPower.hp, truth.peakPower.hp)).toBe(true);
      expect(within1pct(p.peakTorque.lbft, truth.peakTorque.lbft)).toBe(true);
      // Coast-downs and idling are never part of a pull: no negative load on the curve.
      expect(Math.min(...p.curve.torqueLbft)).toBeGreaterThan(0);
      expect(p.pull.sampleRange[0]).toBeLessThanOrEqual(log.pulls[i].sweepStart + 2);
      expect(p.pull.sampleRange[1]).toBeLessThanOrEqual(log.pulls[i].sweepEnd + 1);
    });
    expect(pulls[0].pull.timeRange![1]).toBeLessThan(pulls[1].pull.timeRange![0]);
    expect(pulls[1].pull.timeRange![1]).toBeLessThan(pulls[2].pull.timeRange![0]);
    expect(pulls.map((p) => p.pull.partial)).toEqual([false, false, true]);
    expect(codes(pulls[2])).toContain('PULL_PARTIAL');
    expect(codes(pulls[0])).not.toContain('PULL_PARTIAL');
  });

  it('analyzeBuffer still returns the main pull (largest rpm rise)', () => {
    const r = analyzeBuffer(bytes);
    expect(r.pull.main).toBe(true);
    expect(r.pull.index).toBe(1);
    expect(within1pct(r.peakPower.hp, log.truth.peakPower.hp)).toBe(true);
  });

  it('a single-pull file gives one pull', () => {
    const { pulls, main } = analyzeBufferPulls(renderRunFile(syntheticRun(QUIET)).bytes);
    expect(pulls).toHaveLength(1);
    expect(main).toBe(0);
    expect(pulls[0].pull).toMatchObject({ index: 0, count: 1, main: true, partial: false });
  });
});

describe('tables that end before the file does', () => {
  for (const footer of ['summary', 'notes', 'second-table'] as const) {
    it(`${footer} after the data ends the table with TABLE_ENDED_EARLY and its line`, () => {
      const run = syntheticRun(QUIET);
      const format: RunFileFormat = { footer, columns: ['rpm', 'torque', 'power'] };
      const r = analyzeBuffer(renderRunFile(run, format).bytes);
      expectModelPeaks(r, run.truth);
      const w = r.warnings.find((x) => x.code === 'TABLE_ENDED_EARLY');
      // Header on line 1, samples on lines 2 … N + 1, a blank line, then the footer's first line.
      const footerLine = run.samples.length + 3;
      expect(w?.details).toEqual({ line: footerLine });
      expect(w?.message).toContain(`line ${footerLine}`);
    });
  }

  it('a bad value inside the data is still an error, not the end of the table', () => {
    const lines = renderRunFile(syntheticRun(QUIET), { columns: ['rpm', 'torque', 'power'] }).text.split('\n');
    lines[40] = lines[40].replace(/^(\d+),[^,]+/, '$1,abc');
    expect(() => analyzeBuffer(new TextEncoder().encode(lines.join('\n')))).toThrow(expect.objectContaining({ code: 'NON_NUMERIC', line: 41 }));
  });
});

describe('scaled and unusual speed columns', () => {
  for (const rpmThousands of ['labelled', 'unlabelled'] as const) {
    it(`engine speed in thousands (${rpmThousands}) is scaled with RPM_SCALED`, () => {
      const run = syntheticRun(QUIET);
      const r = analyzeBuffer(renderRunFile(run, { rpmThousands }).bytes);
      expectModelPeaks(r, run.truth);
      expect(r.identity.status).toBe('ok');
      expect(codes(r)).toContain('RPM_SCALED');
      expect(r.rpmRange[0]).toBeGreaterThanOrEqual(1950);
    });
  }

  const languages: [HeaderLanguage, string][] = [
    ['de', 'Drehzahl [1/min]'],
    ['fr', 'Régime moteur [tr/min]'],
    ['it', 'Regime [giri/min]'],
    ['es', 'Régimen [rpm]'],
    ['nl', 'Toerental [omw/min]'],
  ];
  for (const [lang, rpmHeader] of languages) {
    it(`${lang} headers are recognised by name`, () => {
      const run = syntheticRun(QUIET);
      const r = analyzeBuffer(renderRunFile(run, { headerLanguage: lang, torqueUnit: 'nm', powerUnit: lang === 'it' || lang === 'es' ? 'ps' : 'kw' }).bytes);
      expect(r.columns.rpm).toBe(rpmHeader);
      expect(r.columns.time).toBeDefined();
      expect(r.identity.status).toBe('ok');
      expect(r.confidence).toBe(1);
      expect(codes(r)).not.toContain('COLUMNS_GUESSED');
      expectModelPeaks(r, run.truth);
    });
  }
  it('accents and case do not matter', () => {
    const run = syntheticRun(QUIET);
    const text = renderRunFile(run, { headerLanguage: 'fr', torqueUnit: 'nm', powerUnit: 'kw' }).text.replace('Régime moteur', 'REGIME MOTEUR');
    expect(analyzeBuffer(new TextEncoder().encode(text)).columns.rpm).toBe('REGIME MOTEUR [tr/min]');
  });

  it('road speed but no engine speed: NO_RPM_COLUMN says a speed column exists and a ratio can be given', () => {
    const run = syntheticRun(QUIET);
    const bytes = renderRunFile(run, { columns: ['time', 'speed', 'torque', 'power'] }).bytes;
    let err: unknown;
    try {
      analyzeBuffer(bytes);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(AnalysisError);
    expect((err as AnalysisError).code).toBe('NO_RPM_COLUMN');
    expect((err as AnalysisError).details).toMatchObject({ speedColumn: 'Road Speed [mph]', needs: ['rpm'] });
    expect((err as AnalysisError).message).toMatch(/ratio/);
  });

  it('with an engine-speed ratio the curve is computed against engine speed (mph and km/h)', () => {
    // The generator logs road speed as rpm / 46: 46 rpm per mph in that gear (invented).
    const run = syntheticRun(QUIET);
    const mph = analyzeBuffer(renderRunFile(run, { columns: ['time', 'speed', 'torque', 'power'] }).bytes, { rpmPerSpeed: { ratio: 46, unit: 'mph' } });
    expectModelPeaks(mph, run.truth);
    expect(codes(mph)).toContain('RPM_FROM_SPEED');
    expect(mph.identity.status).toBe('ok');
    // The same log in km/h, with the ratio per mph and per km/h (1 mph = 1.609344 km/h, NIST SP 811).
    const kmhBytes = renderRunFile(run, { columns: ['time', 'speed', 'torque', 'power'], speedUnit: 'kmh' }).bytes;
    const perMph = analyzeBuffer(kmhBytes, { rpmPerSpeed: { ratio: 46, unit: 'mph' } });
    const perKmh = analyzeBuffer(kmhBytes, { rpmPerSpeed: { ratio: 46 / 1.609344, unit: 'km/h' } });
    expectModelPeaks(perMph, run.truth);
    expectModelPeaks(perKmh, run.truth);
    expect(() => analyzeBuffer(kmhBytes, { rpmPerSpeed: { ratio: -1, unit: 'mph' } })).toThrow(expect.objectContaining({ code: 'INVALID_OPTION' }));
  });
});

describe('no silent trust', () => {
  it('every warning code the engine emits is in the stable union', () => {
    const run = withGlitches(syntheticRun(QUIET), [{ at: 90, kind: 'double' }]);
    const outputs = [
      ...analyzeBufferPulls(renderRunFile(syntheticLog({ seed: 2, pulls: [{ startRpm: 2000, endRpm: 5800 }, { startRpm: 2000, endRpm: 3000 }] })).bytes).pulls,
      analyzeBuffer(renderRunFile(run, { footer: 'summary', rpmThousands: 'unlabelled' }).bytes),
    ];
    const seen = new Set(outputs.flatMap(codes));
    for (const c of ['PULLS_FOUND', 'PULL_PARTIAL', 'GLITCHES_DROPPED', 'TABLE_ENDED_EARLY', 'RPM_SCALED']) expect(seen).toContain(c);
    for (const c of seen) expect(ANALYSIS_WARNING_CODES).toContain(c);
  });
});

describe('coast-down and decel are never part of the sweep', () => {
  it('the engine slowing under load after the top, or coasting with negative power before and after, is left out', () => {
    const run = syntheticRun(QUIET);
    const top = run.truth.sweepEnd;
    const samples = run.samples.map((s) => ({ ...s }));
    // After the top: the brake overpowers the engine; rpm falls back to 4 000 with positive torque.
    for (let i = top + 1; i < samples.length; i++) {
      const rpm = Math.max(4000, samples[top].rpm - (i - top) * 20);
      const lbft = modelTorqueLbft(run.engine, rpm);
      samples[i] = { ...samples[i], rpm, torqueLbft: lbft, powerHp: (lbft * rpm) / HP_CONSTANT };
    }
    // Before the sweep: a coast-down with negative power from 3 000 rpm into the lead-in.
    for (let i = 0; i < 20; i++) {
      const rpm = 3000 - i * 50;
      samples[i] = { ...samples[i], rpm, torqueLbft: -4, powerHp: (-4 * rpm) / HP_CONSTANT };
    }
    const r = analyzeBuffer(renderRunFile({ ...run, samples }).bytes);
    expectModelPeaks(r, run.truth);
    expect(r.rpmRange[0]).toBeGreaterThanOrEqual(run.truth.startRpm - 50);
    expect(Math.min(...r.curve.torqueLbft)).toBeGreaterThan(0);
    // Only the rising sweep is kept: no more points than it has samples.
    expect(r.points).toBeLessThanOrEqual(run.truth.sweepEnd - run.truth.sweepStart + 2);
  });
});
