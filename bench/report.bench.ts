/**
 * Gain-report PDF render time: median and p95 over a number of renders of an invented
 * three-run report (baseline, stage 1, stage 2) built from synthetic curves. Target: median
 * under 1 s on this machine. Self-contained: no database, storage or network.
 *
 * `npx tsx bench/report.bench.ts` runs it alone; `npm run bench -- report` through the runner.
 */
import { fileURLToPath } from 'node:url';
import { compareCurves, repeatability, type NormalizedCurve } from '@shared/analysis';
import { renderReportPdf } from '../server/modules/reports/pdf/render';
import type { ReportData } from '../server/modules/reports/report-data';
import { HP_TORQUE_CONSTANT } from '@shared/analysis/units';
import { percentile } from './lib/stats';

const RENDERS = 10;
const TARGET_MEDIAN_MS = 1000;

/** An invented torque hump on a 50-rpm grid, hp from lb·ft × rpm / 5252.113. */
function curve(peakLbft: number, peakRpm: number, falloff: number, from = 2000, to = 5800): NormalizedCurve {
  const rpm: number[] = [];
  for (let r = from; r <= to; r += 50) rpm.push(r);
  const torqueLbft = rpm.map((r) => peakLbft * (1 - falloff * ((r - peakRpm) / 1000) ** 2));
  return { rpm, torqueLbft, powerHp: torqueLbft.map((t, i) => (t * rpm[i]) / HP_TORQUE_CONSTANT), afr: {} };
}

/** A report with three runs and two stages of invented parts. */
export function sampleReportData(overrides: Partial<ReportData> = {}): ReportData {
  const curves = [curve(96, 3400, 0.035), curve(101, 3500, 0.033), curve(108, 3700, 0.03)];
  const ids = ['run-base', 'run-s1', 'run-s2'];
  const labels = ['Baseline pull 2', 'Stage 1 pull 3', 'Stage 2 pull 1'];
  const stageNames = ['Baseline', 'Stage 1', 'Stage 2'];
  const figures = curves.slice(1).map((c) => compareCurves(curves[0], c, { bandWidthRpm: 1000 }));
  const peaks = curves.map((c) => {
    let pi = 0;
    let ti = 0;
    c.rpm.forEach((_, i) => {
      if (c.powerHp[i] > c.powerHp[pi]) pi = i;
      if (c.torqueLbft[i] > c.torqueLbft[ti]) ti = i;
    });
    return { peakPower: { hp: c.powerHp[pi], rpm: c.rpm[pi] }, peakTorque: { lbft: c.torqueLbft[ti], rpm: c.rpm[ti] } };
  });
  const rep = repeatability([curves[0], curve(95.6, 3400, 0.035)]);
  const final = figures[figures.length - 1];
  return {
    number: 'R-2026-0007',
    version: 1,
    createdAt: '2026-05-14T10:00:00.000Z',
    shop: { name: 'Northgate Cycle Works', address: '14 Foundry Lane, Millbrook', phone: '555-0142', email: 'desk@northgate.test' },
    units: 'imperial',
    paperSize: 'letter',
    customer: { name: 'Dana Rivera' },
    bike: { make: 'Ridgeback', model: 'Tourer 1800', year: 2019, vin: null, engineFamily: 'RB-V2', displacementCc: 1753 },
    comparison: { id: 'cmp-1', name: 'Stage 2 against baseline' },
    runs: ids.map((id, i) => ({
      id,
      label: labels[i],
      stageName: stageNames[i],
      isBaseline: i === 0,
      colorIndex: i,
      recordedAt: `2026-05-${String(2 + i * 4).padStart(2, '0')}T09:00:00.000Z`,
      dynoName: 'Bay 1 roller',
      dynoKind: 'inertia',
      conditions: { temperatureC: 21 + i, baroKpa: 100.8 - i * 0.3, humidityPct: 40 + i * 5 },
      correctionStandard: 'sae-j1349',
      correctionLabel: 'SAE J1349',
      correctionFactor: 1.012 + i * 0.004,
      ...peaks[i],
    })),
    gains: figures.map((f, i) => ({
      runId: ids[i + 1],
      peakPowerGain: f.peakPowerGain,
      peakTorqueGain: f.peakTorqueGain,
      areaGainPct: f.areaGainPct,
      averagePowerGainHp: f.averagePowerGainHp,
      bands: f.bands.map((b) => ({ from: b.from, to: b.to, averagePowerGainHp: b.averagePowerGainHp })),
      largestGain: f.largestGain,
      largestLoss: f.largestLoss,
    })),
    curves: curves.map((c, i) => ({ runId: ids[i], rpm: c.rpm, powerHp: c.powerHp, torqueLbft: c.torqueLbft })),
    stages: [
      { name: 'Baseline', date: '2026-05-02', isBaseline: true, parts: [], totalCostCents: 0 },
      {
        name: 'Stage 1',
        date: '2026-05-06',
        isBaseline: false,
        parts: [
          { category: 'exhaust', description: 'Two-into-one stainless system', partCostCents: 89_900, labourCostCents: 18_000 },
          { category: 'intake', description: 'High-flow air cleaner', partCostCents: 32_500, labourCostCents: 6_000 },
          { category: 'fuel-tune', description: 'Fuel map on the dyno', partCostCents: 0, labourCostCents: 45_000 },
        ],
        totalCostCents: 191_400,
      },
      {
        name: 'Stage 2',
        date: '2026-05-10',
        isBaseline: false,
        parts: [{ category: 'camshaft', description: 'Bolt-in cam set, mild grind', partCostCents: 54_900, labourCostCents: 72_000 }],
        totalCostCents: 126_900,
      },
    ],
    repeatability: { text: `Baseline repeated twice: peak power within ${rep.peakPowerSpreadHp.toFixed(1)} hp; differences smaller than that are within run-to-run spread.`, runs: 2, peakPowerSpreadHp: rep.peakPowerSpreadHp },
    cost: { totalCostCents: 318_300, gainHp: final.peakPowerGain.hp },
    warnings: [],
    summary: `+${final.peakPowerGain.hp.toFixed(1)} hp at peak; the gain grows with engine speed and is largest near ${final.largestGain.rpm} rpm.`,
    technicianNote: 'Cam break-in done on the dyno. Re-torque the exhaust clamps after the first 300 miles and come back for a free check pull.',
    ...overrides,
  };
}

export async function run(): Promise<void> {
  const data = sampleReportData();
  await renderReportPdf(data); // warm-up: font loading and module initialisation
  const times: number[] = [];
  let bytes = 0;
  for (let i = 0; i < RENDERS; i++) {
    const t0 = performance.now();
    const pdf = await renderReportPdf({ ...data, version: i + 1 });
    times.push(performance.now() - t0);
    bytes = pdf.length;
  }
  times.sort((a, b) => a - b);
  const median = percentile(times, 0.5);
  const p95 = percentile(times, 0.95);
  const rows = [
    ['renders', String(RENDERS)],
    ['median', `${median.toFixed(0)} ms`],
    ['p95', `${p95.toFixed(0)} ms`],
    ['min / max', `${times[0].toFixed(0)} / ${times[times.length - 1].toFixed(0)} ms`],
    ['PDF size', `${(bytes / 1000).toFixed(1)} kB`],
    ['target', `median < ${TARGET_MEDIAN_MS} ms: ${median < TARGET_MEDIAN_MS ? 'met' : 'MISSED'}`],
  ];
  const w = Math.max(...rows.map((r) => r[0].length));
  process.stdout.write(`| ${'gain-report PDF'.padEnd(w)} | value |\n|${'-'.repeat(w + 2)}|-------|\n`);
  for (const [k, v] of rows) process.stdout.write(`| ${k.padEnd(w)} | ${v} |\n`);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) await run();
