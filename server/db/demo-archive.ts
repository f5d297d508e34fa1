/**
 * Demo archive (sessions, stages, parts and runs) added on top of the base demo data. Every
 * figure is invented: runs come from the invented engine model of server/db/synthetic-runs.ts
 * and from the files in sample-data/, and go through the same ingest pipeline as an upload, so
 * their raw files land in object storage.
 */
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { AppDeps } from '../app-deps';
import type { Actor } from '../http/actor';
import type { PartCategory, HeadWorkLevel } from '@shared/parts';
import { extendDemo, type DemoIds } from './demo-seed';
import { syntheticRunFile, type EngineModel } from './synthetic-runs';
import { Shop } from '../modules/shops/shop.entity';
import { Bike } from '../modules/bikes/bike.entity';
import { Dyno } from '../modules/dynos/dyno.entity';
import { User } from '../modules/users/user.entity';
import { DynoSession } from '../modules/sessions/dyno-session.entity';
import { Part, Stage } from '../modules/stages/stage.entity';
import { Run } from '../modules/runs/run.entity';
import { ingestFiles, type IncomingFile } from '../modules/runs/upload-runs';
import { refreshBikeOutcomes } from '../modules/builds/build-outcome.service';
import { createComparison } from '../modules/comparisons/comparison.service';
import { createReport } from '../modules/reports/report.service';
import { comparisonInput } from '@shared/schemas/comparison';

const SAMPLE_DIR = fileURLToPath(new URL('../../sample-data', import.meta.url));
const DAY = 86_400_000;

type PartSpec = { category: PartCategory; description: string; part: number; labour: number; head?: HeadWorkLevel };
interface StageSpec {
  name: string;
  description: string;
  /** Torque scale against the stock engine, and where the torque peak moves (rpm). */
  gain: number;
  peakShiftRpm: number;
  parts: PartSpec[];
}

/** A typical big-twin build history (invented costs, in dollars). */
const BUILD: StageSpec[] = [
  { name: 'Baseline', description: 'As delivered: stock exhaust, intake and calibration.', gain: 1, peakShiftRpm: 0, parts: [] },
  {
    name: 'Stage 1 — exhaust + tune',
    description: 'Free-flowing exhaust and high-flow air cleaner, fuel map set on the dyno.',
    gain: 1.08,
    peakShiftRpm: 100,
    parts: [
      { category: 'exhaust', description: '2-into-1 stainless exhaust', part: 1089, labour: 165 },
      { category: 'intake', description: 'High-flow air cleaner kit', part: 289, labour: 55 },
      { category: 'fuel-tune', description: 'Fuel and spark map, three dyno sessions', part: 0, labour: 425 },
    ],
  },
  {
    name: 'Stage 2 — camshaft',
    description: 'Bolt-in cam with matching pushrods and lifters; map revised.',
    gain: 1.15,
    peakShiftRpm: 350,
    parts: [
      { category: 'camshaft', description: 'Bolt-in torque cam, 0.585 in lift', part: 649, labour: 540 },
      { category: 'camshaft', description: 'Adjustable pushrods and high-rate lifters', part: 412, labour: 0 },
      { category: 'fuel-tune', description: 'Map revision for the cam', part: 0, labour: 240 },
    ],
  },
  {
    name: 'Stage 3 — ported heads',
    description: 'Cylinder heads ported, valve job, springs to suit the cam.',
    gain: 1.22,
    peakShiftRpm: 550,
    parts: [
      { category: 'cylinder-heads', description: 'Head porting and three-angle valve job', part: 380, labour: 1150, head: 'full-port' },
      { category: 'cylinder-heads', description: 'Valve springs and retainers', part: 265, labour: 0 },
      { category: 'fuel-tune', description: 'Final map on the dyno', part: 0, labour: 260 },
    ],
  },
];

/** Invented stock engines of the demo bikes (torque at the wheel). */
const ENGINES: EngineModel[] = [
  { peakTorqueLbft: 94, peakTorqueRpm: 3300, falloff: 0.036 },
  { peakTorqueLbft: 103, peakTorqueRpm: 3200, falloff: 0.038 },
  { peakTorqueLbft: 82, peakTorqueRpm: 3400, falloff: 0.034 },
  { peakTorqueLbft: 93, peakTorqueRpm: 3350, falloff: 0.036 },
];

const CONDITIONS = [
  { ambientTempC: 18.5, baroKpa: 100.4, humidityPct: 48 },
  { ambientTempC: 24.0, baroKpa: 99.8, humidityPct: 35 },
  { ambientTempC: 29.5, baroKpa: 99.1, humidityPct: 28 },
  { ambientTempC: 21.0, baroKpa: 101.2, humidityPct: 55 },
];

async function newSession(em: EntityManager, shop: Shop, bike: Bike, dyno: Dyno, tuner: User, at: Date, k: number, notes: string) {
  const s = em.create(DynoSession, {
    shop,
    bike,
    dyno,
    operator: tuner,
    startedAt: at,
    ...CONDITIONS[k % CONDITIONS.length],
    correctionStandard: 'sae-j1349',
    notes,
    safetyConfirmedBy: tuner,
    safetyConfirmedAt: at,
  } as DynoSession);
  await em.flush();
  return s;
}

async function newStage(em: EntityManager, shop: Shop, bike: Bike, position: number, spec: { name: string; description: string; parts: PartSpec[] }, date: Date) {
  const stage = em.create(Stage, { shop, bike, position, name: spec.name, description: spec.description, date: date.toISOString().slice(0, 10) } as Stage);
  spec.parts.forEach((p, i) =>
    em.create(Part, {
      shop,
      stage,
      category: p.category,
      description: p.description,
      partCostCents: Math.round(p.part * 100),
      labourCostCents: Math.round(p.labour * 100),
      headWorkLevel: p.category === 'cylinder-heads' ? (p.head ?? null) : null,
      createdAt: new Date(date.getTime() + i),
    } as Part),
  );
  await em.flush();
  return stage;
}

/** Upload through the real pipeline, date the runs to their session, pick the best as reference. */
async function pull(em: EntityManager, deps: AppDeps, actor: Actor, bike: Bike, session: DynoSession, stage: Stage, files: IncomingFile[], tags: string[]) {
  const results = await ingestFiles(em, deps, actor, { bikeId: bike.id, sessionId: session.id, stageId: stage.id }, files);
  const ids = results.flatMap((r) => (r.ok ? [r.run.id] : r.runId ? [r.runId] : []));
  const runs = await em.find(Run, { id: { $in: ids } }, { orderBy: { sequence: 'asc' } });
  runs.forEach((r, i) => {
    r.createdAt = new Date(session.startedAt.getTime() + (i + 1) * 6 * 60_000);
    r.tags = tags;
  });
  const best = runs.filter((r) => r.status === 'ready').sort((x, y) => (y.peakPowerHp ?? 0) - (x.peakPowerHp ?? 0))[0];
  if (best) {
    stage.referenceRun = best;
    best.note = 'Best of the session; chosen as the stage’s reference run.';
  }
  await em.flush();
}

async function buildArchive(deps: AppDeps, em: EntityManager, ids: DemoIds) {
  const shop = await em.findOneOrFail(Shop, ids.shopId);
  const dyno = await em.findOneOrFail(Dyno, ids.dynoId);
  const tuner = await em.findOneOrFail(User, ids.users.tuner);
  const actor: Actor = { id: tuner.id, shopId: shop.id, role: 'tuner', email: tuner.email, name: tuner.name, customerId: null };
  const now = Date.now();

  // Four bikes with a full build history, one visit per stage, three pulls per visit.
  for (let b = 0; b < ENGINES.length && b < ids.bikes.length; b++) {
    const bike = await em.findOneOrFail(Bike, ids.bikes[b].id);
    const stages = BUILD.slice(0, b === 2 ? 2 : b === 3 ? 3 : BUILD.length); // not every customer went all the way
    for (let s = 0; s < stages.length; s++) {
      const spec = stages[s];
      const at = new Date(now - (330 - b * 20 - s * 70) * DAY + 10 * 3600_000);
      const session = await newSession(em, shop, bike, dyno, tuner, at, b + s, s === 0 ? 'Baseline before any work; fan on, third gear.' : `After ${spec.name.toLowerCase()}.`);
      const stage = await newStage(em, shop, bike, s, spec, at);
      const engine = { ...ENGINES[b], peakTorqueRpm: ENGINES[b].peakTorqueRpm + spec.peakShiftRpm };
      const files: IncomingFile[] = [0, 1, 2].map((p) => {
        const seed = 1000 * (b + 1) + 10 * s + p;
        // Pull-to-pull spread of about half a percent (invented), heat-soak on the last pull.
        const { bytes } = syntheticRunFile({ seed, engine, gain: spec.gain * (1 - 0.004 * p), endRpm: 5800 + spec.peakShiftRpm }, { columns: ['time', 'rpm', 'torque', 'power', 'afr'] });
        return { originalName: `bay1-${ids.bikes[b].label.toLowerCase().replace(/[^a-z0-9]+/g, '-')}-${s}-${p + 1}.csv`, contentType: 'text/csv', bytes: Buffer.from(bytes) };
      });
      await pull(em, deps, actor, bike, session, stage, files, s === 0 ? ['baseline'] : [`stage-${s}`]);
    }
    await refreshBikeOutcomes(em, bike.id);
  }

  // The sample files (every export format the reader knows) as an older bike's archive.
  const sampleBike = ids.bikes[5] ?? ids.bikes[ids.bikes.length - 1];
  if (sampleBike && fs.existsSync(SAMPLE_DIR)) {
    const bike = await em.findOneOrFail(Bike, sampleBike.id);
    const names = fs.readdirSync(SAMPLE_DIR).sort();
    const groups: { stage: { name: string; description: string; parts: PartSpec[] }; prefix: string }[] = [
      { stage: { name: 'Baseline', description: 'Stock, from the previous owner’s visits.', parts: [] }, prefix: 'baseline' },
      { stage: BUILD[1], prefix: 'stage1' },
    ];
    for (const [g, group] of groups.entries()) {
      const at = new Date(now - (200 - g * 45) * DAY + 14 * 3600_000);
      const session = await newSession(em, shop, bike, dyno, tuner, at, g + 1, 'Files from several dyno PCs, brought into the archive.');
      const stage = await newStage(em, shop, bike, g, group.stage, at);
      const files = names
        .filter((n) => n.startsWith(group.prefix))
        .map((n) => ({ originalName: n, contentType: n.endsWith('.csv') ? 'text/csv' : 'text/plain', bytes: fs.readFileSync(path.join(SAMPLE_DIR, n)) }));
      await pull(em, deps, actor, bike, session, stage, files, ['imported']);
    }
    await refreshBikeOutcomes(em, bike.id);
  }
}

/**
 * What the shop leaves behind after the first customer's last visit: two saved comparisons of
 * that bike (baseline against the whole build, and the last stage on its own) and the gain
 * report made from the first, so every role has something to open.
 */
async function saveComparisonsAndReport(deps: AppDeps, em: EntityManager, ids: DemoIds, actor: Actor) {
  const bike = ids.bikes[0];
  if (!bike) return;
  const stages = await em.find(Stage, { bike: bike.id }, { orderBy: { position: 'asc' } });
  const measured = stages.filter((s) => s.referenceRun);
  if (measured.length < 3) return;
  const [first, beforeLast, last] = [measured[0], measured[measured.length - 2], measured[measured.length - 1]];
  const save = (name: string, from: Stage, to: Stage, note: string) =>
    createComparison(em, actor, comparisonInput.parse({ name, runIds: [from.referenceRun!.id, to.referenceRun!.id], baselineRunId: from.referenceRun!.id, options: { correction: 'sae-j1349' }, note }));
  const whole = await save(`${first.name} against ${last.name}`, first, last, 'The whole build so far, reference pull against reference pull.');
  await save(`${beforeLast.name} against ${last.name}`, beforeLast, last, 'What the last stage added on its own.');
  await createReport(deps, em, actor, { comparisonId: whole.id, technicianNote: 'All pulls in third gear on bay 1 with the fan on; figures corrected to SAE J1349.' });
}

extendDemo(async (deps, em, ids) => {
  await buildArchive(deps, em, ids);
  const tuner = await em.findOneOrFail(User, ids.users.tuner);
  await saveComparisonsAndReport(deps, em, ids, { id: tuner.id, shopId: ids.shopId, role: 'tuner', email: tuner.email, name: tuner.name, customerId: null });
});
