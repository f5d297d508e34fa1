import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { ComparisonFixtures, curveFromPower, humpWithPeaks, type FixtureCurve } from '../support/comparison-fixtures';
import { compareCurves, repeatability } from '@shared/analysis/compare';
import { applyCorrection } from '@shared/analysis/curve';
import { correctionFactor } from '@shared/analysis/correction';
import { Bike } from '@server/modules/bikes/bike.entity';
import { Run } from '@server/modules/runs/run.entity';
import { evaluateComparison } from '@server/modules/comparisons/evaluate-comparison';
import { comparisonCandidates } from '@server/modules/comparisons/comparison-candidates';
import { toActor } from '@server/modules/auth/auth.service';

let t: TestApp;
let a: TestShop;
let b: TestShop;
let fx: ComparisonFixtures;

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Comp Alpha');
  b = await t.createShop('Comp Beta');
  fx = new ComparisonFixtures(t.deps.orm.em.fork(), a.shop);
});
afterAll(() => t.close());

/** Seeds ready runs on one dyno, same day, same conditions, stored uncorrected (factor 1). */
async function seedRuns(bike: Bike, curves: FixtureCurve[], extra: Partial<Parameters<ComparisonFixtures['run']>[1]> = {}): Promise<Run[]> {
  const dyno = fx.dyno();
  const session = fx.session(bike, { dyno });
  const runs = curves.map((curve, i) => fx.run(bike, { curve, session, label: `Pull ${i + 1}`, ...extra }));
  await fx.flush();
  return runs;
}

async function preview(body: object, role: keyof TestShop['users'] = 'tuner') {
  const agent = await t.signIn(a.users[role]);
  return agent.post('/api/comparisons/preview').send(body);
}

/** A new bike of shop A's customer, fixtures on a new EntityManager, and a session on a new dyno. */
function freshBike(model: string) {
  const em = t.deps.orm.em.fork();
  const f = new ComparisonFixtures(em, a.shop);
  const bike = em.create(Bike, { shop: a.shop.id, customer: a.customer.id, make: 'Testmake', model, cylinders: 2 } as never) as Bike;
  const dyno = f.dyno();
  return { em, f, bike, dyno, session: f.session(bike, { dyno }) };
}

describe('preview figures', () => {
  // Linear power curves: Δhp(r) = 2 + 0.002·r is linear, so the trapezoidal rule integrates it
  // exactly (its error term (b−a)·h²·f''/12 vanishes when f'' = 0). Closed forms over [2000, 6000]:
  //   ∫(20 + 0.01 r) dr = 20·4000 + 0.005·(6000² − 2000²) = 240 000 hp·rpm
  //   ∫(22 + 0.012 r) dr = 22·4000 + 0.006·(6000² − 2000²) = 280 000 hp·rpm
  const base = curveFromPower((r) => 20 + 0.01 * r);
  const other = curveFromPower((r) => 22 + 0.012 * r);

  it('matches hand-computed values of linear curves (trapezoidal rule exact for linear integrands)', async () => {
    const [r0, r1] = await seedRuns(a.bike, [base, other]);
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id, options: {} });
    expect(res.status).toBe(200);
    const r = res.body.results[0];
    expect(res.body.baseline.runId).toBe(r0.id);
    expect(r.runId).toBe(r1.id);
    expect(r.commonRpm).toEqual([2000, 6000]);
    // Peaks at 6000 rpm: 20 + 60 = 80 hp and 22 + 72 = 94 hp → +14 hp, +17.5 %.
    expect(r.peakPowerGain.hp).toBeCloseTo(14, 6);
    expect(r.peakPowerGain.pct).toBeCloseTo(17.5, 4);
    expect(r.peakPowerRpmShift).toBe(0);
    // (280 000 − 240 000) / 240 000 = 16.667 %.
    expect(r.areaGainPct).toBeCloseTo((40_000 / 240_000) * 100, 3);
    // Mean of a linear function = its value at the midpoint: 2 + 0.002·4000 = 10 hp.
    expect(r.averagePowerGainHp).toBeCloseTo(10, 6);
    // Bands of 1000 rpm: midpoints 2500, 3500, 4500, 5500 → 7, 9, 11, 13 hp.
    expect(r.bands.map((x: { from: number }) => x.from)).toEqual([2000, 3000, 4000, 5000]);
    expect(r.bands.map((x: { averagePowerGainHp: number }) => x.averagePowerGainHp)).toEqual([7, 9, 11, 13].map((v) => expect.closeTo(v, 6)));
    expect(r.largestGain).toEqual({ rpm: 6000, hp: expect.closeTo(14, 6) });
    expect(r.largestLoss).toEqual({ rpm: 2000, hp: expect.closeTo(6, 6) });
    // The sentences come from these numbers (+14.0 hp at peak, +17.5 %).
    expect(res.body.summary[0]).toMatch(/^\+14\.0 hp at peak \(\+17\.5 %\)/);
    expect(res.body.summary.join(' ')).toMatch(/run-to-run spread is unknown/);
    // Aligned curves: one grid, one series per run.
    expect(res.body.curves.rpm[0]).toBe(2000);
    expect(res.body.curves.runs).toHaveLength(2);
    expect(res.body.curves.runs[1].powerHp[res.body.curves.rpm.indexOf(4000)]).toBeCloseTo(22 + 48, 3);
  });

  it('matches the analysis module for a quadratic difference, within the trapezoidal error bound', async () => {
    // Δhp(r) = 1e-6·(r − 2000)²: ∫ over [2000, 6000] = 1e-6·4000³/3 = 21 333.33 hp·rpm, mean 5.3333 hp.
    // Composite trapezoidal error for a quadratic is exactly (b − a)·h²·f''/12 = 4000·50²·2e-6/12
    // = 0.00167 hp·rpm (Burden & Faires, Numerical Analysis, composite trapezoidal rule; from memory).
    const quad = curveFromPower((r) => 20 + 0.01 * r + 1e-6 * (r - 2000) ** 2);
    const [r0, r1] = await seedRuns(a.bike, [base, quad]);
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id, options: { bandWidthRpm: 500 } });
    expect(res.status).toBe(200);
    const r = res.body.results[0];
    const exactMean = (1e-6 * 4000 ** 3) / 3 / 4000;
    const bound = (4000 * 50 ** 2 * 2e-6) / 12 / 4000;
    expect(Math.abs(r.averagePowerGainHp - exactMean)).toBeLessThanOrEqual(bound + 1e-4);
    expect(r.averagePowerGainHp).toBeGreaterThanOrEqual(exactMean - 1e-4); // trapezoid over-estimates a convex function
    const direct = compareCurves(base, quad, { bandWidthRpm: 500 });
    expect(r.areaGainPct).toBeCloseTo(direct.areaGainPct, 3);
    expect(r.peakPowerGain.hp).toBeCloseTo(direct.peakPowerGain.hp, 3);
    expect(r.peakTorqueGain.lbft).toBeCloseTo(direct.peakTorqueGain.lbft, 3);
    expect(r.bands).toHaveLength(direct.bands.length);
    direct.bands.forEach((band, i) => expect(r.bands[i].averagePowerGainHp).toBeCloseTo(band.averagePowerGainHp, 3));
    expect(r.largestGain.rpm).toBe(direct.largestGain.rpm);
    expect(r.delta.powerHp.length).toBe(direct.delta.rpm.length);
  });

  it('reports the head-port check: ≈ +6.8 hp (+7.2 %) and ≈ −4.1 lb·ft', async () => {
    // Trade check value, common practice, no published source: a head port alone moving peak power
    // from about 94.5 to 101.3 hp while peak torque fell from about 109.1 to 105 lb·ft.
    const before = humpWithPeaks(109.1, 3200, 94.5);
    const after = humpWithPeaks(105, 3600, 101.3);
    const [r0, r1] = await seedRuns(a.bike, [before, after]);
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id, options: {} });
    expect(res.status).toBe(200);
    const r = res.body.results[0];
    expect(res.body.baseline.peakPower.hp).toBeCloseTo(94.5, 1);
    expect(r.peakPowerGain.hp).toBeCloseTo(6.8, 1);
    expect(r.peakPowerGain.pct).toBeCloseTo(7.2, 1);
    expect(r.peakTorqueGain.lbft).toBeCloseTo(-4.1, 1);
    expect(res.body.summary[0]).toMatch(/^\+6\.8 hp at peak \(\+7\.2 %\)/);
    expect(res.body.summary[1]).toMatch(/^Peak torque −4\.1 lb·ft/);
  });

  it('re-corrects every run from its uncorrected curve with the chosen standard', async () => {
    const hot = { temperatureC: 35, baroKpa: 97, humidityPct: 40 };
    const cool = { temperatureC: 28, baroKpa: 99.5, humidityPct: 20 };
    const dyno = fx.dyno();
    const session = fx.session(a.bike, { dyno });
    const r0 = fx.run(a.bike, { curve: base, session, conditions: hot, correctionStandard: 'din-70020', correctionFactor: 1.07 });
    const r1 = fx.run(a.bike, { curve: other, session, conditions: cool, correctionStandard: 'din-70020', correctionFactor: 1.03 });
    await fx.flush();
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id, options: { correction: 'sae-j1349' } });
    expect(res.status).toBe(200);
    const f0 = correctionFactor('sae-j1349', hot);
    const f1 = correctionFactor('sae-j1349', cool);
    expect(res.body.runs[0].correction).toEqual({ standard: 'sae-j1349', factor: expect.closeTo(f0, 4), source: 'recomputed' });
    const direct = compareCurves(applyCorrection(base, f0), applyCorrection(other, f1));
    const r = res.body.results[0];
    expect(r.peakPowerGain.hp).toBeCloseTo(direct.peakPowerGain.hp, 3);
    expect(r.averagePowerGainHp).toBeCloseTo(direct.averagePowerGainHp, 3);
    expect(r.areaGainPct).toBeCloseTo(direct.areaGainPct, 3);
    // Peak of the baseline: 80 hp × CF.
    expect(res.body.baseline.peakPower.hp).toBeCloseTo(80 * f0, 3);
    expect(res.body.warnings.map((w: { code: string }) => w.code)).not.toContain('MIXED_CORRECTION');

    // Without a chosen standard, each run keeps its stored factor.
    const stored = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id });
    expect(stored.body.runs.map((x: { correction: { factor: number } }) => x.correction.factor)).toEqual([1.07, 1.03]);
    expect(stored.body.results[0].peakPowerGain.hp).toBeCloseTo(94 * 1.03 - 80 * 1.07, 3);
  });

  it('gives exactly 1 at each standard’s reference conditions (SAE J1349: 25 °C, 99 kPa dry air; DIN 70020: 20 °C, 101.3 kPa — from memory)', async () => {
    const dyno = fx.dyno();
    const session = fx.session(a.bike, { dyno });
    const r0 = fx.run(a.bike, { curve: base, session, conditions: { temperatureC: 25, baroKpa: 99, humidityPct: 0 } });
    const r1 = fx.run(a.bike, { curve: other, session, conditions: { temperatureC: 25, baroKpa: 99, humidityPct: 0 } });
    await fx.flush();
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id, options: { correction: 'sae-j1349' } });
    expect(res.body.runs[0].correction.factor).toBeCloseTo(1, 6);
    expect(res.body.baseline.peakPower.hp).toBeCloseTo(80, 4);
  });

  it('applies smoothing, rpm range and band width options', async () => {
    const [r0, r1] = await seedRuns(a.bike, [base, other]);
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id, options: { rpmRange: [3000, 5000], bandWidthRpm: 500, smooth: 7 } });
    expect(res.status).toBe(200);
    const r = res.body.results[0];
    expect(r.commonRpm).toEqual([3000, 5000]);
    expect(r.bands).toHaveLength(4);
    // Savitzky–Golay (order 2) reproduces a straight line exactly, so the figures are unchanged:
    // peaks within 3000–5000 are at 5000 rpm: 22 + 60 = 82 hp against 20 + 50 = 70 hp → +12 hp.
    expect(r.peakPowerGain.hp).toBeCloseTo(12, 4);
    expect(r.averagePowerGainHp).toBeCloseTo(2 + 0.002 * 4000, 4);
    expect(res.body.curves.rpm[0]).toBe(3000);
    expect(res.body.curves.rpm[res.body.curves.rpm.length - 1]).toBe(5000);
  });
});

describe('fairness warnings', () => {
  const base = curveFromPower((r) => 20 + 0.01 * r);
  const other = curveFromPower((r) => 22 + 0.012 * r);
  const codes = (res: { body: { warnings: { code: string }[] } }) => res.body.warnings.map((w) => w.code);

  it('a fair pair has no fairness warning', async () => {
    const [r0, r1] = await seedRuns(a.bike, [base, other]);
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id });
    expect(codes(res)).toEqual([]);
  });

  it('warns about different correction standards', async () => {
    const [r0] = await seedRuns(a.bike, [base], { correctionStandard: 'sae-j1349', correctionFactor: 1.02 });
    const [r1] = await seedRuns(a.bike, [other], { correctionStandard: 'din-70020', correctionFactor: 1.04 });
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id });
    expect(codes(res)).toContain('MIXED_CORRECTION');
    // Choosing one standard for all removes it.
    const fixed = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id, options: { correction: 'sae-j1349' } });
    expect(codes(fixed)).not.toContain('MIXED_CORRECTION');
  });

  it('warns about different dynos', async () => {
    const [r0] = await seedRuns(a.bike, [base]);
    const [r1] = await seedRuns(a.bike, [other]);
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id });
    expect(codes(res)).toContain('DIFFERENT_DYNOS');
  });

  it('warns when air temperature is more than 10 °C apart, not at 10 °C', async () => {
    const [r0, r1] = await seedRuns(a.bike, [base, other]);
    r0.conditions = { temperatureC: 14, baroKpa: 100 };
    r1.conditions = { temperatureC: 24.5, baroKpa: 100 };
    const [r2] = await seedRuns(a.bike, [other], { conditions: { temperatureC: 24, baroKpa: 100 } });
    await fx.flush();
    const apart = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id });
    expect(codes(apart)).toContain('TEMPERATURE_APART');
    // In both unit systems: 10.5 °C apart = 18.9 °F apart; 14 °C = 57.2 °F, 24.5 °C = 76.1 °F (°F = °C × 1.8 + 32).
    const message = apart.body.warnings.find((w: { code: string }) => w.code === 'TEMPERATURE_APART').message;
    expect(message).toContain('10.5 °C / 18.9 °F');
    expect(message).toContain('14.0 °C / 57.2 °F');
    expect(message).toContain('24.5 °C / 76.1 °F');
    // 10 °C apart exactly is not "more than 10" (r2 is on another dyno, so look only for the temperature code).
    expect(codes(await preview({ runIds: [r0.id, r2.id], baselineRunId: r0.id }))).not.toContain('TEMPERATURE_APART');
  });

  it('warns when pressure is more than 3 kPa apart', async () => {
    const [r0, r1] = await seedRuns(a.bike, [base, other]);
    r0.conditions = { temperatureC: 20, baroKpa: 101.2 };
    r1.conditions = { temperatureC: 20, baroKpa: 97.9 };
    await fx.flush();
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id });
    expect(codes(res)).toEqual(['PRESSURE_APART']);
    // 3.3 kPa = 0.97 inHg; 101.2 kPa = 29.88 inHg (1 inHg = 3.38638 kPa, NIST SP 811).
    expect(res.body.warnings[0].message).toContain('3.3 kPa / 0.97 inHg');
    expect(res.body.warnings[0].message).toContain('101.2 kPa / 29.88 inHg');
  });

  it('warns about a cross-check mismatch in one run', async () => {
    const [r0, r1] = await seedRuns(a.bike, [base, other]);
    r1.identityStatus = 'mismatch';
    await fx.flush();
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id });
    expect(codes(res)).toEqual(['CROSS_CHECK_MISMATCH']);
    expect(res.body.warnings[0].runIds).toEqual([r1.id]);
  });

  it('warns when rpm ranges barely overlap (< 50 % of the narrower run)', async () => {
    // 2000–4000 and 3500–6000: shared 500 rpm of the narrower 2000 rpm = 25 %.
    const low = curveFromPower((r) => 20 + 0.01 * r, 2000, 4000);
    const high = curveFromPower((r) => 22 + 0.012 * r, 3500, 6000);
    const [r0, r1] = await seedRuns(a.bike, [low, high]);
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id });
    expect(res.status).toBe(200);
    expect(codes(res)).toEqual(['LITTLE_OVERLAP']);
    expect(res.body.results[0].commonRpm).toEqual([3500, 4000]);
    // 2000–4000 and 2800–6000: 1200 of 2000 = 60 % — no warning.
    const wide = curveFromPower((r) => 22 + 0.012 * r, 2800, 6000);
    const [r2] = await seedRuns(a.bike, [wide]);
    const [r3] = await seedRuns(a.bike, [low]);
    r2.session = r3.session;
    await fx.flush();
    expect(codes(await preview({ runIds: [r3.id, r2.id], baselineRunId: r3.id }))).not.toContain('LITTLE_OVERLAP');
  });

  it('falls back to the stored factor with a clear warning when conditions are missing', async () => {
    const [r0, r1] = await seedRuns(a.bike, [base, other], { correctionStandard: 'sae-j1349', correctionFactor: 1.05 });
    r1.conditions = null;
    await fx.flush();
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id, options: { correction: 'iso-1585' } });
    expect(res.status).toBe(200);
    const w = res.body.warnings.find((x: { code: string }) => x.code === 'CONDITIONS_MISSING');
    expect(w.message).toMatch(/cannot be corrected to ISO 1585/);
    expect(w.message).toMatch(/stored correction \(SAE J1349, factor 1\.050\)/);
    expect(res.body.runs[1].correction).toEqual({ standard: 'sae-j1349', factor: 1.05, source: 'fallback' });
    // The fallback leaves two standards in play, which is itself unfair.
    expect(codes(res)).toContain('MIXED_CORRECTION');
  });

  it('refuses runs that share no rpm range', async () => {
    const low = curveFromPower((r) => 20 + 0.01 * r, 2000, 3000);
    const high = curveFromPower((r) => 22 + 0.012 * r, 3500, 6000);
    const [r0, r1] = await seedRuns(a.bike, [low, high]);
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('NO_COMMON_RANGE');
  });
});

describe('repeatability', () => {
  it('marks a gain smaller than the stage’s run-to-run spread as within repeatability', async () => {
    const dyno = fx.dyno();
    const session = fx.session(a.bike, { dyno });
    const s0 = fx.stage(a.bike, 'Stock', 0);
    const s1 = fx.stage(a.bike, 'Pipe', 1);
    // Baseline stage: two pulls 1.5 hp apart everywhere (spread 1.5 hp).
    const b1 = fx.run(a.bike, { curve: curveFromPower((r) => 20 + 0.01 * r), stage: s0, session });
    const b2 = fx.run(a.bike, { curve: curveFromPower((r) => 21.5 + 0.01 * r), stage: s0, session });
    // Next stage: +1 hp flat below 4000, +5 hp flat above.
    const n1 = fx.run(a.bike, { curve: curveFromPower((r) => 20 + 0.01 * r + (r < 4000 ? 1 : 5)), stage: s1, session });
    await fx.flush();
    const res = await preview({ runIds: [b1.id, n1.id], baselineRunId: b1.id });
    expect(res.status).toBe(200);
    const rep = res.body.repeatability.find((x: { stageId: string }) => x.stageId === s0.id);
    const direct = repeatability([b1.curve!, b2.curve!] as never);
    expect(rep.runs).toBe(2);
    expect(rep.peakPowerSpreadHp).toBeCloseTo(direct.peakPowerSpreadHp, 4);
    expect(rep.peakPowerSpreadHp).toBeCloseTo(1.5, 4);
    expect(rep.averagePowerSpreadHp).toBeCloseTo(1.5, 4);
    const r = res.body.results[0];
    expect(r.withinRepeatability.peakPower).toBe(false); // +5 hp at peak > 1.5 hp
    expect(r.bands[0].withinRepeatability).toBe(true); // +1 hp in 2000–3000 < 1.5 hp
    expect(r.bands[0].spreadHp).toBeCloseTo(1.5, 4);
    expect(r.bands[3].withinRepeatability).toBe(false);
    expect(res.body.summary[0]).toMatch(/most of the gain is above 4,000 rpm/);
    // Both bands below 4000 gain ≈ 1 hp (the 3000–4000 band 1.1 hp: the step at 4000 rpm adds one
    // 50-rpm trapezoid of (1 + 5)/2), under the 1.5 hp spread.
    expect(r.bands[1].averagePowerGainHp).toBeCloseTo(1.1, 6);
    expect(res.body.summary[0]).toMatch(/below 4,000 rpm the change is within run-to-run spread/);
  });
});

describe('curves read again after a change (the read model caches parsed curves)', () => {
  it('a curve rewritten by hand-written SQL, updated_at untouched, is what the next preview uses', async () => {
    const [r0, r1] = await seedRuns(a.bike, [curveFromPower((r) => 20 + 0.01 * r), curveFromPower((r) => 22 + 0.01 * r)]);
    const first = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id });
    expect(first.body.results[0].averagePowerGainHp).toBeCloseTo(2, 6);
    const em = t.deps.orm.em.fork();
    const [before] = await em.getConnection().execute<{ v: string }[]>('select updated_at::text as v from run where id = ?', [r1.id]);
    // +5 hp flat instead of +2: the run_curve_version trigger moves updated_at, so the cache misses.
    await em.getConnection().execute('update run set curve = ? where id = ?', [JSON.stringify(curveFromPower((r) => 25 + 0.01 * r)), r1.id]);
    const [after] = await em.getConnection().execute<{ v: string }[]>('select updated_at::text as v from run where id = ?', [r1.id]);
    expect(after.v).not.toBe(before.v);
    const second = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id });
    expect(second.body.results[0].averagePowerGainHp).toBeCloseTo(5, 6);
  });

  it('inside a transaction, sees the transaction’s own uncommitted runs', async () => {
    const actor = toActor(a.users.tuner);
    await t.deps.orm.em.fork().transactional(async (tx) => {
      const f = new ComparisonFixtures(tx, a.shop);
      const bike = tx.getReference(Bike, a.bike.id);
      const r0 = f.run(bike, { curve: curveFromPower((r) => 30 + 0.01 * r), label: 'In tx 1' });
      const r1 = f.run(bike, { curve: curveFromPower((r) => 33 + 0.01 * r), label: 'In tx 2' });
      await tx.flush();
      const res = await evaluateComparison(tx, actor, { runIds: [r0.id, r1.id], baselineRunId: r0.id });
      expect(res.results[0].averagePowerGainHp).toBeCloseTo(3, 6);
      expect(res.runs.map((x) => x.name)).toEqual(['In tx 1', 'In tx 2']);
      // Roll back: these runs never existed.
      throw new RollBack();
    }).catch((e) => {
      if (!(e instanceof RollBack)) throw e;
    });
    expect(await t.deps.orm.em.fork().count(Run, { label: { $in: ['In tx 1', 'In tx 2'] } })).toBe(0);
  });
});
class RollBack extends Error {}

describe('access and validation', () => {
  const base = curveFromPower((r) => 20 + 0.01 * r);
  const other = curveFromPower((r) => 22 + 0.012 * r);

  it('lets every staff role preview; customers get 403; signed out 401', async () => {
    const [r0, r1] = await seedRuns(a.bike, [base, other]);
    const body = { runIds: [r0.id, r1.id], baselineRunId: r0.id };
    for (const role of ['owner', 'tuner', 'desk'] as const) expect((await preview(body, role)).status).toBe(200);
    expect((await preview(body, 'customer')).status).toBe(403);
    expect((await t.request.post('/api/comparisons/preview').send(body)).status).toBe(401);
  });

  it('answers 404 for another shop’s runs', async () => {
    const [r0, r1] = await seedRuns(a.bike, [base, other]);
    const agent = await t.signIn(b.users.owner);
    const res = await agent.post('/api/comparisons/preview').send({ runIds: [r0.id, r1.id], baselineRunId: r0.id });
    expect(res.status).toBe(404);
  });

  it('rejects a baseline outside the runs, one run, thirteen runs and duplicates', async () => {
    const [r0, r1] = await seedRuns(a.bike, [base, other]);
    const stray = '6f0c8a52-5a7e-4c52-9a55-0d6b5f2f1a11';
    expect((await preview({ runIds: [r0.id, r1.id], baselineRunId: stray })).status).toBe(400);
    expect((await preview({ runIds: [r0.id], baselineRunId: r0.id })).status).toBe(400);
    const many = Array.from({ length: 13 }, (_, i) => `6f0c8a52-5a7e-4c52-9a55-0d6b5f2f1a${String(i).padStart(2, '0')}`);
    expect((await preview({ runIds: many, baselineRunId: many[0] })).status).toBe(400);
    expect((await preview({ runIds: [r0.id, r0.id], baselineRunId: r0.id })).status).toBe(400);
    expect((await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id, options: { rpmRange: [5000, 3000] } })).status).toBe(400);
  });

  it('compares runs of two bikes and says so', async () => {
    const [r0] = await seedRuns(a.bike, [base]);
    const [r1] = await seedRuns(a.otherBike, [other]);
    r1.session = r0.session;
    await fx.flush();
    const res = await preview({ runIds: [r0.id, r1.id], baselineRunId: r0.id });
    expect(res.status).toBe(200);
    expect(res.body.warnings.map((w: { code: string }) => w.code)).toEqual(['SEVERAL_BIKES']);
  });
});

describe('saved comparisons', () => {
  const base = curveFromPower((r) => 20 + 0.01 * r);
  const other = curveFromPower((r) => 22 + 0.012 * r);

  it('saves, reads back with figures, lists by bike and deletes', async () => {
    const [r0, r1, r2] = await seedRuns(a.bike, [base, other, curveFromPower((r) => 21 + 0.011 * r)]);
    const tuner = await t.signIn(a.users.tuner);
    const options = { correction: 'sae-j1349', bandWidthRpm: 500, units: 'kw-nm' };
    const saved = await tuner.post('/api/comparisons').send({ name: 'Pipe and tune', runIds: [r0.id, r1.id, r2.id], baselineRunId: r0.id, options, note: 'For the rider' });
    expect(saved.status).toBe(201);
    expect(saved.body.id).toMatch(/^[0-9a-f-]{36}$/);
    expect(saved.body.bikeId).toBe(a.bike.id);

    const got = await tuner.get(`/api/comparisons/${saved.body.id}`);
    expect(got.status).toBe(200);
    expect(got.body.comparison).toMatchObject({ name: 'Pipe and tune', runIds: [r0.id, r1.id, r2.id], baselineRunId: r0.id, options, note: 'For the rider' });
    expect(got.body.preview.results).toHaveLength(2);
    const direct = await preview({ runIds: [r0.id, r1.id, r2.id], baselineRunId: r0.id, options });
    expect(got.body.preview.results).toEqual(direct.body.results);
    // Sentences follow the chosen units: 14 hp × 0.7457 kW/hp (NIST SP 811: 1 hp = 745.6999 W) × CF.
    expect(got.body.preview.summary[0]).toMatch(/ kW at peak/);

    const list = await tuner.get('/api/comparisons').query({ bikeId: a.bike.id });
    expect(list.body.items.map((c: { id: string }) => c.id)).toContain(saved.body.id);
    const otherList = await tuner.get('/api/comparisons').query({ bikeId: a.otherBike.id });
    expect(otherList.body.items.map((c: { id: string }) => c.id)).not.toContain(saved.body.id);

    // The rider of the bike may read it; another shop may not; desk may not delete.
    const rider = await t.signIn(a.users.customer);
    expect((await rider.get(`/api/comparisons/${saved.body.id}`)).status).toBe(200);
    expect((await rider.get('/api/comparisons')).body.items.map((c: { id: string }) => c.id)).toContain(saved.body.id);
    expect((await (await t.signIn(b.users.owner)).get(`/api/comparisons/${saved.body.id}`)).status).toBe(404);
    expect((await (await t.signIn(a.users.desk)).delete(`/api/comparisons/${saved.body.id}`)).status).toBe(403);
    expect((await tuner.delete(`/api/comparisons/${saved.body.id}`)).status).toBe(204);
    expect((await tuner.get(`/api/comparisons/${saved.body.id}`)).status).toBe(404);
  });

  it('hides comparisons of another rider’s bike from a customer', async () => {
    const [r0, r1] = await seedRuns(a.otherBike, [base, other]);
    const owner = await t.signIn(a.users.owner);
    const saved = await owner.post('/api/comparisons').send({ name: 'Not yours', runIds: [r0.id, r1.id], baselineRunId: r0.id });
    expect(saved.status).toBe(201);
    const rider = await t.signIn(a.users.customer);
    expect((await rider.get(`/api/comparisons/${saved.body.id}`)).status).toBe(404);
    expect((await rider.get('/api/comparisons')).body.items.map((c: { id: string }) => c.id)).not.toContain(saved.body.id);
  });

  it('reads a saved comparison whose run was deleted, with a plain previewError', async () => {
    const [r0, r1] = await seedRuns(a.bike, [base, other]);
    const owner = await t.signIn(a.users.owner);
    const saved = await owner.post('/api/comparisons').send({ name: 'Soon broken', runIds: [r0.id, r1.id], baselineRunId: r0.id });
    r1.deletedAt = new Date();
    await fx.flush();
    const got = await owner.get(`/api/comparisons/${saved.body.id}`);
    expect(got.status).toBe(200);
    expect(got.body.preview).toBeNull();
    expect(got.body.previewError.message).toMatch(/deleted/);
  });
});

describe('stage timeline', () => {
  it('gives each stage its gains, costs and cost per hp', async () => {
    const owner = await t.signIn(a.users.owner);
    const { em, f, bike, session } = freshBike('Timeline');
    const s0 = f.stage(bike, 'Stock', 0);
    const s1 = f.stage(bike, 'Pipe + tune', 1, [
      { category: 'exhaust', description: 'Two-into-one pipe', partCostCents: 90_000, labourCostCents: 20_000 },
      { category: 'fuel-tune', description: 'Dyno tune', partCostCents: 0, labourCostCents: 50_000 },
    ]);
    const s2 = f.stage(bike, 'Heads', 2, [{ category: 'cylinder-heads', description: 'Mild port', partCostCents: 150_000, labourCostCents: 50_000 }]);
    // Linear curves: stock 20 + 0.01 r; pipe +4 hp flat; heads a further +0.002 r − 4 (zero at 2000, +8 at 6000).
    const stock = f.run(bike, { curve: curveFromPower((r) => 20 + 0.01 * r), stage: s0, session });
    const stock2 = f.run(bike, { curve: curveFromPower((r) => 20.4 + 0.01 * r), stage: s0, session });
    const pipe = f.run(bike, { curve: curveFromPower((r) => 24 + 0.01 * r), stage: s1, session });
    const heads = f.run(bike, { curve: curveFromPower((r) => 20 + 0.012 * r), stage: s2, session });
    s0.referenceRun = stock;
    s1.referenceRun = pipe;
    s2.referenceRun = heads;
    await em.flush();
    void stock2;

    const res = await owner.get('/api/comparisons/timeline').query({ bikeId: bike.id });
    expect(res.status).toBe(200);
    const [t0, t1, t2] = res.body.stages;
    expect(t0.vsPrevious).toBeNull();
    expect(t0.reference.peakPowerHp).toBeCloseTo(80, 4);
    expect(t0.repeatability.peakPowerSpreadHp).toBeCloseTo(0.4, 4);
    // Pipe: +4 hp at peak and on average; cost 1600.00 → 400.00 per hp (40 000 cents).
    expect(t1.costCents).toBe(160_000);
    expect(t1.vsPrevious.peakPowerHp).toBeCloseTo(4, 4);
    expect(t1.vsPrevious.averagePowerHp).toBeCloseTo(4, 4);
    expect(t1.vsPrevious.withinRepeatability.peakPower).toBe(false);
    expect(t1.costPerHp).toEqual({ peakCents: 40_000, averageCents: 40_000 });
    // Heads vs pipe: Δ = 0.002 r − 4 → at peak (6000) 92 − 84 = +8 hp; average over 2000–6000 = 0.002·4000 − 4 = +4 hp.
    expect(t2.vsPrevious.peakPowerHp).toBeCloseTo(8, 4);
    expect(t2.vsPrevious.averagePowerHp).toBeCloseTo(4, 4);
    expect(t2.costPerHp).toEqual({ peakCents: 25_000, averageCents: 50_000 });
    // Cumulative vs stock: +12 hp at peak, +8 hp average for 3600.00.
    expect(t2.vsBaseline.peakPowerHp).toBeCloseTo(12, 4);
    expect(t2.vsBaseline.averagePowerHp).toBeCloseTo(8, 4);
    expect(t2.cumulativeCostCents).toBe(360_000);
    expect(t2.cumulativeCostPerHp).toEqual({ peakCents: 30_000, averageCents: 45_000 });
    expect(t2.parts.map((p: { description: string }) => p.description)).toEqual(['Mild port']);

    const rider = await t.signIn(a.users.customer);
    expect((await rider.get('/api/comparisons/timeline').query({ bikeId: bike.id })).status).toBe(200);
    expect((await rider.get('/api/comparisons/timeline').query({ bikeId: a.otherBike.id })).status).toBe(404);
    expect((await (await t.signIn(b.users.owner)).get('/api/comparisons/timeline').query({ bikeId: bike.id })).status).toBe(404);
  });
});

describe('stage timeline, a stage without a reference run (hand-computed)', () => {
  it('charges the stage in between to the next measured gain, as the gain report does', async () => {
    const owner = await t.signIn(a.users.owner);
    const { em, f, bike, session } = freshBike('Gap');
    const s0 = f.stage(bike, 'Stock', 0);
    // Not measured: no reference run.
    f.stage(bike, 'Pipe + tune', 1, [{ category: 'exhaust', description: 'Two-into-one pipe', partCostCents: 90_000, labourCostCents: 70_000 }]);
    const s2 = f.stage(bike, 'Heads', 2, [{ category: 'cylinder-heads', description: 'Mild port', partCostCents: 150_000, labourCostCents: 50_000 }]);
    s0.referenceRun = f.run(bike, { curve: curveFromPower((r) => 20 + 0.01 * r), stage: s0, session });
    s2.referenceRun = f.run(bike, { curve: curveFromPower((r) => 20 + 0.012 * r), stage: s2, session });
    await em.flush();

    const res = await owner.get('/api/comparisons/timeline').query({ bikeId: bike.id });
    expect(res.status).toBe(200);
    const heads = res.body.stages[2];
    // Hand-computed: Δ = 0.002 r → +12 hp at 6000 rpm, average over 2000–6000 rpm = 0.002 × 4000 = +8 hp.
    // The gain was bought by Pipe + tune (1600.00) and Heads (2000.00) = 3600.00:
    // 360 000 / 12 = 30 000 cents per hp at peak, 360 000 / 8 = 45 000 per average hp — not Heads alone (16 667).
    expect(heads.vsPrevious.peakPowerHp).toBeCloseTo(12, 4);
    expect(heads.vsPrevious.averagePowerHp).toBeCloseTo(8, 4);
    expect(heads.costCents).toBe(200_000);
    expect(heads.costPerHp).toEqual({ peakCents: 30_000, averageCents: 45_000 });
    expect(heads.cumulativeCostPerHp).toEqual({ peakCents: 30_000, averageCents: 45_000 });
  });
});

describe('run colours', () => {
  it('a run keeps its colour slot whether it is compared with one run or with three', async () => {
    const tuner = await t.signIn(a.users.tuner);
    const { em, f, bike, session } = freshBike('Colours');
    const stages = [0, 1, 2, 3].map((i) => f.stage(bike, i === 0 ? 'Baseline' : `Stage ${i}`, i));
    const runs = stages.map((st, i) => f.run(bike, { curve: curveFromPower((r) => 20 + i + 0.01 * r), stage: st, session }));
    await em.flush();
    const slots = async (ids: string[]) => {
      const res = await tuner.post('/api/comparisons/preview').send({ runIds: ids, baselineRunId: ids[0] });
      expect(res.status).toBe(200);
      return new Map<string, number>(res.body.runs.map((r: { runId: string; colorIndex: number }) => [r.runId, r.colorIndex]));
    };
    const two = await slots([runs[2].id, runs[3].id]);
    const three = await slots([runs[0].id, runs[2].id, runs[3].id]);
    // Our rule (server/modules/comparisons/run-colors.ts): the slot is the run's place in its bike's
    // archive by stage position — Baseline 0, Stage 1 1, Stage 2 2, Stage 3 3 — whatever else is compared.
    expect(two.get(runs[3].id)).toBe(3);
    expect(three.get(runs[3].id)).toBe(3);
    expect(two.get(runs[2].id)).toBe(three.get(runs[2].id));
    expect(new Set(three.values()).size).toBe(3);
  });

  it('a saved comparison keeps its colours when runs are added to an earlier stage', async () => {
    const tuner = await t.signIn(a.users.tuner);
    const { em, f, bike, session } = freshBike('Saved colours');
    const [s0, s1, s2] = [0, 1, 2].map((i) => f.stage(bike, i === 0 ? 'Baseline' : `Stage ${i}`, i));
    const base = f.run(bike, { curve: curveFromPower((r) => 20 + 0.01 * r), stage: s0, session });
    const after = f.run(bike, { curve: curveFromPower((r) => 23 + 0.01 * r), stage: s2, session });
    await em.flush();
    const body = { runIds: [base.id, after.id], baselineRunId: base.id, options: {} };
    const saved = await tuner.post('/api/comparisons').send({ ...body, name: 'Before and after' });
    expect(saved.status).toBe(201);
    const colours = async () => {
      const res = await tuner.get(`/api/comparisons/${saved.body.id}`);
      expect(res.status).toBe(200);
      return res.body.preview.runs.map((r: { colorIndex: number }) => r.colorIndex);
    };
    const before = await colours();
    expect(before).toEqual([0, 1]); // archive order: Baseline run 0, Stage 2 run 1

    // Two more pulls on Stage 1 move the Stage 2 run to archive place 3.
    f.run(bike, { curve: curveFromPower((r) => 21 + 0.01 * r), stage: s1, session });
    f.run(bike, { curve: curveFromPower((r) => 21.5 + 0.01 * r), stage: s1, session });
    await em.flush();
    const fresh = await tuner.post('/api/comparisons/preview').send(body);
    expect(fresh.body.runs.map((r: { colorIndex: number }) => r.colorIndex)).toEqual([0, 3]);
    expect(await colours()).toEqual(before);
  });
});

describe('builder candidates', () => {
  it('suggests the previous stage’s reference run against the latest stage’s', async () => {
    const { em, f, bike, session } = freshBike('Builder');
    const s0 = f.stage(bike, 'Stock', 0);
    const s1 = f.stage(bike, 'Pipe', 1);
    const s2 = f.stage(bike, 'Cam', 2);
    const r0 = f.run(bike, { curve: curveFromPower((r) => 20 + 0.01 * r), stage: s0, session });
    const r1 = f.run(bike, { curve: curveFromPower((r) => 22 + 0.01 * r), stage: s1, session });
    const r2 = f.run(bike, { curve: curveFromPower((r) => 25 + 0.01 * r), stage: s2, session });
    f.run(bike, { curve: curveFromPower((r) => 25 + 0.01 * r), stage: s2, session, status: 'needs-mapping' });
    s0.referenceRun = r0;
    s1.referenceRun = r1;
    s2.referenceRun = r2;
    await em.flush();
    const desk = await t.signIn(a.users.desk);
    const res = await desk.get('/api/comparisons/candidates').query({ bikeId: bike.id });
    expect(res.status).toBe(200);
    expect(res.body.runs).toHaveLength(4);
    expect(res.body.suggestion).toEqual({ baselineRunId: r1.id, runIds: [r1.id, r2.id] });
    expect((await (await t.signIn(a.users.customer)).get('/api/comparisons/candidates').query({ bikeId: bike.id })).status).toBe(403);
    expect((await (await t.signIn(b.users.desk)).get('/api/comparisons/candidates').query({ bikeId: bike.id })).status).toBe(404);
  });

  it('without references chosen, suggests the previous stage’s newest ready run against the latest stage’s', async () => {
    const { em, f, bike, session } = freshBike('Builder two');
    const s0 = f.stage(bike, 'Baseline', 0);
    const s1 = f.stage(bike, 'Stage 1', 1);
    const b1 = f.run(bike, { curve: curveFromPower((r) => 20 + 0.01 * r), stage: s0, session });
    const b2 = f.run(bike, { curve: curveFromPower((r) => 20.5 + 0.01 * r), stage: s0, session });
    const t1 = f.run(bike, { curve: curveFromPower((r) => 22 + 0.01 * r), stage: s1, session });
    const t2 = f.run(bike, { curve: curveFromPower((r) => 22.5 + 0.01 * r), stage: s1, session });
    b1.createdAt = new Date('2026-12-01T10:00:00Z');
    b2.createdAt = new Date('2026-12-01T10:01:00Z');
    t1.createdAt = new Date('2026-12-01T11:00:00Z');
    t2.createdAt = new Date('2026-12-01T11:01:00Z');
    await em.flush();
    // The use case itself: this file's sign-ins are near the sign-in rate limit.
    const res = { body: await comparisonCandidates(t.deps.orm.em.fork(), toActor(a.users.tuner), { bikeId: bike.id }) };
    // The two newest runs (both of stage 1) were suggested before; now one run per stage.
    expect(res.body.suggestion).toEqual({ baselineRunId: b2.id, runIds: [b2.id, t2.id] });
  });
});
