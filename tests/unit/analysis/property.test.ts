import { describe, it } from 'vitest';
import fc from 'fast-check';
import { AnalysisError, analyzeBuffer } from '@shared/analysis/index';
import { type RunFileFormat, type SyntheticGlitch, renderRunFile, syntheticRun, syntheticRunFile, withGlitches } from '@server/db/synthetic-runs';

/**
 * "Within bounded time" (the engine's contract for any input): every property stops generating
 * new inputs after RUN_LIMIT_MS (fast-check interruptAfterTimeLimit), and each single input must
 * be answered within PER_INPUT_LIMIT_MS. Both are generous bounds that catch a runaway loop or
 * a pathological input (the inputs are at most a few KB); they are not speed targets, which live
 * in `npm run bench`.
 */
const RUN_LIMIT_MS = 20_000;
const PER_INPUT_LIMIT_MS = 5_000;
const bounded = { plugins: [fc.interruptAfterTimeLimit(RUN_LIMIT_MS)] };

/** Runs `fn` and fails the property when one input takes longer than PER_INPUT_LIMIT_MS. */
function withinBound(fn: () => boolean): boolean {
  const t0 = performance.now();
  const ok = fn();
  const ms = performance.now() - t0;
  if (ms > PER_INPUT_LIMIT_MS) throw new Error(`one input took ${Math.round(ms)} ms (bound ${PER_INPUT_LIMIT_MS} ms)`);
  return ok;
}

function resultOrTypedError(bytes: Uint8Array): boolean {
  return withinBound(() => {
    try {
      const r = analyzeBuffer(bytes);
      return r.ok === true && Number.isFinite(r.peakPower.hp) && r.curve.rpm.length >= 5;
    } catch (e) {
      return e instanceof AnalysisError && typeof e.code === 'string' && e.message.length > 0;
    }
  });
}

describe('property: any input gives a result or a typed error', () => {
  it('arbitrary bytes', () => {
    fc.assert(fc.property(fc.uint8Array({ maxLength: 4096 }), resultOrTypedError), { numRuns: 300, ...bounded });
  });

  it('arbitrary text made of table-like characters', () => {
    const chars = fc.constantFrom(...'0123456789.,;|\t\n\r-" eE:abcRPMTorquePowerhpNm[]()'.split(''));
    fc.assert(fc.property(fc.array(chars, { maxLength: 3000 }).map((a) => new TextEncoder().encode(a.join(''))), resultOrTypedError), { numRuns: 300, ...bounded });
  });

  it('corrupted real files (bytes flipped, truncated)', () => {
    const base = syntheticRunFile({ seed: 4 }).bytes;
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.nat(base.length - 1), fc.integer({ min: 0, max: 255 })), { maxLength: 30 }), fc.nat(base.length), (edits, cut) => {
        const b = base.slice(0, Math.max(cut, 1));
        for (const [i, v] of edits) if (i < b.length) b[i] = v;
        return resultOrTypedError(b);
      }),
      { numRuns: 200, ...bounded },
    );
  });

  it('every generated format is read with the model’s peak power (within 1 %)', () => {
    const format = fc.record({
      delimiter: fc.constantFrom(',', ';', '\t', '|'),
      lineEnding: fc.constantFrom('\n', '\r\n', '\r'),
      encoding: fc.constantFrom('utf-8', 'utf-8-bom', 'utf-16le', 'utf-16be', 'latin1'),
      headerStyle: fc.constantFrom('brackets', 'parentheses', 'abbreviated', 'units-row'),
      torqueUnit: fc.constantFrom('lbft', 'nm', 'kgfm'),
      powerUnit: fc.constantFrom('hp', 'kw', 'ps'),
      preamble: fc.constantFrom('colon', 'delimited', 'none'),
      decimalComma: fc.boolean(),
    });
    fc.assert(
      fc.property(format, fc.integer({ min: 1, max: 10_000 }), (f, seed) => {
        const fmt = { ...f, decimalComma: f.delimiter !== ',' && f.decimalComma, conditions: { temperatureC: 21, baroKpa: 100 } } as RunFileFormat;
        const { run, bytes } = syntheticRunFile({ seed, torqueNoise: 0.05 }, fmt);
        return withinBound(() => {
          const r = analyzeBuffer(bytes);
          return Math.abs(r.peakPower.hp / run.truth.peakPower.hp - 1) < 0.01 && r.identity.status === 'ok';
        });
      }),
      { numRuns: 60, ...bounded },
    );
  });
});

describe('property: isolated glitches barely move the peaks', () => {
  it('up to 2 % isolated glitches in a clean pull move peak power and torque by less than 1 %', () => {
    const clean = syntheticRun({ seed: 21, rpmNoise: 2, torqueNoise: 0.05 });
    const base = analyzeBuffer(renderRunFile(clean).bytes);
    const n = clean.samples.length;
    const most = Math.floor(0.02 * n);
    const glitch = fc.record({
      // Isolated: positions are spread in slots of 3 samples, one glitch per slot at most.
      slot: fc.integer({ min: 0, max: Math.floor(n / 3) - 1 }),
      kind: fc.constantFrom('dropout', 'double', 'half', 'spike') as fc.Arbitrary<SyntheticGlitch['kind']>,
      torqueSpike: fc.boolean(),
    });
    fc.assert(
      fc.property(fc.uniqueArray(glitch, { maxLength: most, selector: (g) => g.slot }), (gs) => {
        const run = withGlitches(clean, gs.map((g) => ({ at: 3 * g.slot + 1, kind: g.kind, torqueSpike: g.torqueSpike })));
        return withinBound(() => {
          const r = analyzeBuffer(renderRunFile(run).bytes);
          return Math.abs(r.peakPower.hp / base.peakPower.hp - 1) < 0.01 && Math.abs(r.peakTorque.lbft / base.peakTorque.lbft - 1) < 0.01;
        });
      }),
      { numRuns: 80, ...bounded },
    );
  });
});
