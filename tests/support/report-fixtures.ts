/**
 * A bike with a baseline and two stages of work, ready runs with known peaks, and a saved
 * comparison — the starting point of the report tests and the share-page browser test.
 */
import { deflateSync, crc32 } from 'node:zlib';
import type { TestApp, TestShop } from './test-app';
import { ComparisonFixtures, humpWithPeaks } from './comparison-fixtures';

/**
 * Reference conditions of SAE J1349 (25 °C, 99 kPa dry air): the correction factor is exactly 1
 * there (src/shared/analysis/correction.ts), so the corrected peaks equal the curves' own peaks.
 */
export const REFERENCE_AIR = { temperatureC: 25, baroKpa: 99, humidityPct: 0 };

/** Known peak power of each run, set by construction (humpWithPeaks solves for it). */
export const PEAKS_HP = { baseline: 85, baselineRepeat: 84.6, stage1: 92, stage2: 103.5 };

export async function seedReportScenario(t: TestApp, s: TestShop) {
  const fx = new ComparisonFixtures(t.deps.orm.em.fork(), s.shop);
  const dyno = fx.dyno('Bay one roller', 'inertia');
  const session = fx.session(s.bike, { dyno, ambientTempC: 25, baroKpa: 99, humidityPct: 0 });
  const base = fx.stage(s.bike, 'Baseline', 0);
  const s1 = fx.stage(s.bike, 'Stage 1', 1, [
    { category: 'exhaust', description: 'Two-into-one stainless system', partCostCents: 89_900, labourCostCents: 18_000 },
    { category: 'fuel-tune', description: 'Fuel map on the dyno', partCostCents: 0, labourCostCents: 45_000 },
  ]);
  const s2 = fx.stage(s.bike, 'Stage 2', 2, [{ category: 'camshaft', description: 'Bolt-in cam set, mild grind', partCostCents: 54_900, labourCostCents: 72_000 }]);
  const common = { session, conditions: REFERENCE_AIR, correctionStandard: 'sae-j1349', correctionFactor: 1 };
  const r0 = fx.run(s.bike, { ...common, stage: base, label: 'Baseline pull 1', curve: humpWithPeaks(96, 3400, PEAKS_HP.baseline) });
  const r0b = fx.run(s.bike, { ...common, stage: base, label: 'Baseline pull 2', curve: humpWithPeaks(95.6, 3400, PEAKS_HP.baselineRepeat) });
  const r1 = fx.run(s.bike, { ...common, stage: s1, label: 'Stage 1 pull 1', curve: humpWithPeaks(101, 3500, PEAKS_HP.stage1) });
  const r2 = fx.run(s.bike, { ...common, stage: s2, label: 'Stage 2 pull 1', curve: humpWithPeaks(108, 3700, PEAKS_HP.stage2) });
  await fx.flush();
  const tuner = await t.signIn(s.users.tuner);
  const res = await tuner.post('/api/comparisons').send({ name: 'Stage 2 against baseline', runIds: [r0.id, r1.id, r2.id], baselineRunId: r0.id, options: { correction: 'sae-j1349' } });
  if (res.status !== 201) throw new Error(`saving the comparison failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { comparisonId: res.body.id as string, runs: { r0, r0b, r1, r2 }, stages: { base, s1, s2 } };
}

/** A valid PNG of one flat colour (RFC 2083 / ISO 15948 layout: signature, IHDR, IDAT, IEND). */
export function solidPng(width: number, height: number, rgb: [number, number, number]): Buffer {
  const chunk = (type: string, data: Buffer) => {
    const len = Buffer.alloc(4);
    len.writeUInt32BE(data.length);
    const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
    const crc = Buffer.alloc(4);
    crc.writeUInt32BE(crc32(body) >>> 0);
    return Buffer.concat([len, body, crc]);
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // truecolour RGB
  const row = Buffer.concat([Buffer.from([0]), Buffer.alloc(width * 3).fill(Buffer.from(rgb))]);
  const raw = Buffer.concat(Array.from({ length: height }, () => row));
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), chunk('IDAT', deflateSync(raw)), chunk('IEND', Buffer.alloc(0))]);
}
