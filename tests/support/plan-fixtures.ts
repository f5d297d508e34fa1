/**
 * Archive builds for build-plan tests: bikes whose stages have parts, hand-set gains and
 * reference runs with simple straight power curves, so every expected figure is known. Invented.
 */
import { randomUUID } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { HeadWorkLevel, PartCategory } from '@shared/parts';
import { Bike } from '@server/modules/bikes/bike.entity';
import type { Customer } from '@server/modules/customers/customer.entity';
import { Part, Stage } from '@server/modules/stages/stage.entity';
import { Run } from '@server/modules/runs/run.entity';
import { Shop } from '@server/modules/shops/shop.entity';

/** A straight power curve 2,000–6,000 rpm; `gain` hp more at 6,000 rpm, growing linearly with rpm. */
export function straightCurve(gain: number) {
  const rpm: number[] = [];
  for (let r = 2000; r <= 6000; r += 100) rpm.push(r);
  const powerHp = rpm.map((r) => 40 + r / 100 + (gain * r) / 6000);
  return { rpm, powerHp, torqueLbft: rpm.map((r, i) => (powerHp[i] * 5252.113) / r), afr: {} };
}

export async function addArchiveBike(em: EntityManager, shopId: string, customer: Customer, cc: number, stages: { peak?: number; parts: { category: PartCategory; level?: HeadWorkLevel; cost?: number }[] }[]) {
  const shop = em.getReference(Shop, shopId);
  const bike = em.create(Bike, { shop, customer, make: 'Corvane', model: `M${cc}`, engineFamily: 'Vantor 103', displacementCc: cc, cylinders: 2 } as Bike);
  let cumulative = 0;
  [{ parts: [] as never[] }, ...stages].forEach((s, position) => {
    const peak = 'peak' in s && s.peak !== undefined ? s.peak : null;
    if (peak !== null) cumulative = peak;
    const stage = em.create(Stage, { shop, bike, position, name: position ? `Stage ${position}` : 'Baseline', gainPeakPowerHp: position ? peak : null, gainAveragePowerHp: position && peak !== null ? peak / 2 : null, totalCostCents: s.parts.reduce((n, p) => n + (p.cost ?? 0), 0) } as Stage);
    for (const p of s.parts) em.create(Part, { shop, stage, category: p.category, description: 'work', headWorkLevel: p.level ?? null, partCostCents: p.cost ?? 0, labourCostCents: 0 } as Part);
    const run = em.create(Run, {
      shop, bike, stage, sequence: 1, rawKey: `k/${randomUUID()}`, rawSha256: randomUUID().replace(/-/g, '').padEnd(64, '0'), rawSizeBytes: 10, originalName: 'pull.csv',
      status: 'ready', warnings: [], tags: [], curve: straightCurve(position === 0 ? 0 : cumulative), correctionFactor: 1, peakPowerHp: 100,
    } as unknown as Run);
    stage.referenceRun = run;
  });
  await em.flush();
  return bike;
}

