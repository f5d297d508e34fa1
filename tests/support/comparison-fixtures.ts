/**
 * Rows for comparison tests and benches: dynos, sessions, stages and ready runs whose stored
 * (uncorrected) curves come from closed-form functions, so the expected figures are known.
 * Written straight through the ORM, independent of the upload pipeline.
 */
import { randomUUID } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import { HP_TORQUE_CONSTANT } from '@shared/analysis/units';
import { peaksOf } from '@shared/analysis/curve';
import { Run } from '@server/modules/runs/run.entity';
import { Stage, Part } from '@server/modules/stages/stage.entity';
import { DynoSession } from '@server/modules/sessions/dyno-session.entity';
import { Dyno } from '@server/modules/dynos/dyno.entity';
import type { Shop } from '@server/modules/shops/shop.entity';
import type { Bike } from '@server/modules/bikes/bike.entity';
import type { PartCategory } from '@shared/parts';

/** A curve on a regular grid from a power function (torque follows from lb·ft = hp × 5252.113 / rpm). */
export function curveFromPower(power: (rpm: number) => number, fromRpm = 2000, toRpm = 6000, step = 50) {
  const rpm: number[] = [];
  for (let r = fromRpm; r <= toRpm + 1e-9; r += step) rpm.push(r);
  const powerHp = rpm.map(power);
  return { rpm, powerHp, torqueLbft: rpm.map((r, i) => (powerHp[i] * HP_TORQUE_CONSTANT) / r), afr: {} as Record<string, number[]> };
}

/** A curve from a torque function (hp = lb·ft × rpm / 5252.113). */
export function curveFromTorque(torque: (rpm: number) => number, fromRpm = 2000, toRpm = 6000, step = 50) {
  return curveFromPower((r) => (torque(r) * r) / HP_TORQUE_CONSTANT, fromRpm, toRpm, step);
}

/**
 * A torque hump T(r) = peak · (1 − f · ((r − peakRpm)/1000)²) whose power peak over the range is
 * `peakPowerHp` — f found by bisection (the peak power falls monotonically as f grows).
 */
export function humpWithPeaks(peakTorqueLbft: number, peakTorqueRpm: number, peakPowerHp: number, fromRpm = 2000, toRpm = 6000, step = 50) {
  const torque = (f: number) => (r: number) => peakTorqueLbft * (1 - f * ((r - peakTorqueRpm) / 1000) ** 2);
  const maxPower = (f: number) => peaksOf(curveFromTorque(torque(f), fromRpm, toRpm, step)).peakPower.hp;
  let lo = 0;
  let hi = 1;
  for (let i = 0; i < 60; i++) {
    const mid = (lo + hi) / 2;
    if (maxPower(mid) > peakPowerHp) lo = mid;
    else hi = mid;
  }
  return curveFromTorque(torque((lo + hi) / 2), fromRpm, toRpm, step);
}

export type FixtureCurve = ReturnType<typeof curveFromPower>;

export interface RunSeed {
  curve: FixtureCurve;
  stage?: Stage | null;
  session?: DynoSession | null;
  label?: string;
  conditions?: { temperatureC?: number; baroKpa?: number; humidityPct?: number } | null;
  correctionStandard?: string;
  correctionFactor?: number;
  identityStatus?: 'ok' | 'derived' | 'mismatch';
  status?: 'ready' | 'needs-mapping' | 'failed';
}

export class ComparisonFixtures {
  constructor(
    readonly em: EntityManager,
    readonly shop: Shop,
  ) {}

  dyno(name = 'Bay one roller', kind: Dyno['kind'] = 'inertia') {
    return this.em.create(Dyno, { shop: this.shop, name, kind } as Dyno);
  }

  session(bike: Bike, opts: { dyno?: Dyno | null; ambientTempC?: number | null; baroKpa?: number | null; humidityPct?: number | null } = {}) {
    return this.em.create(DynoSession, {
      shop: this.shop,
      bike,
      dyno: opts.dyno ?? null,
      ambientTempC: opts.ambientTempC ?? null,
      baroKpa: opts.baroKpa ?? null,
      humidityPct: opts.humidityPct ?? null,
      correctionStandard: 'sae-j1349',
    } as DynoSession);
  }

  stage(bike: Bike, name: string, position: number, parts: { category: PartCategory; description: string; partCostCents: number; labourCostCents?: number }[] = []) {
    const stage = this.em.create(Stage, { shop: this.shop, bike, name, position } as Stage);
    let total = 0;
    for (const p of parts) {
      this.em.create(Part, { shop: this.shop, stage, category: p.category, description: p.description, partCostCents: p.partCostCents, labourCostCents: p.labourCostCents ?? 0 } as Part);
      total += p.partCostCents + (p.labourCostCents ?? 0);
    }
    stage.totalCostCents = total;
    return stage;
  }

  run(bike: Bike, seed: RunSeed) {
    const c = seed.curve;
    const peaks = peaksOf(c);
    const run = this.em.create(Run, {
      shop: this.shop,
      bike,
      session: seed.session ?? null,
      stage: seed.stage ?? null,
      label: seed.label ?? null,
      sequence: 1,
      rawKey: `fixtures/${randomUUID()}`,
      rawSha256: randomUUID().replace(/-/g, '').padEnd(64, '0'),
      rawSizeBytes: 1000,
      originalName: `${seed.label ?? 'pull'}.csv`,
      status: seed.status ?? 'ready',
      curve: c,
      peakPowerHp: peaks.peakPower.hp,
      peakPowerRpm: peaks.peakPower.rpm,
      peakTorqueLbft: peaks.peakTorque.lbft,
      peakTorqueRpm: peaks.peakTorque.rpm,
      rpmMin: c.rpm[0],
      rpmMax: c.rpm[c.rpm.length - 1],
      points: c.rpm.length,
      identityStatus: seed.identityStatus ?? 'ok',
      maxDeviationPct: 0,
      correctionStandard: seed.correctionStandard ?? 'none',
      correctionFactor: seed.correctionFactor ?? 1,
      conditions: seed.conditions === undefined ? { temperatureC: 25, baroKpa: 101, humidityPct: 30 } : seed.conditions,
      columns: null,
      warnings: [],
      tags: [],
    } as unknown as Run);
    return run;
  }

  flush() {
    return this.em.flush();
  }
}
