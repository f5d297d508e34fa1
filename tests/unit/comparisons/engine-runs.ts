/**
 * Plain runs for the comparison engine's unit tests: constant-torque curves, whose power is a
 * straight line in rpm, so every figure can be worked out by hand.
 */
import type { EngineRun } from '@server/modules/comparisons/engine';

/** 33,000 ft·lbf/min ÷ 2π: hp = lbf·ft × rpm / 5252.113 (1 hp = 550 ft·lbf/s, by definition). */
export const HP_CONSTANT = 5252.113;

/** A constant torque of `lbft` from `from` to `to` rpm every `step` rpm. */
export function flatTorque(lbft: number, from = 2000, to = 6000, step = 250) {
  const rpm: number[] = [];
  for (let r = from; r <= to; r += step) rpm.push(r);
  return { rpm, torqueLbft: rpm.map(() => lbft), powerHp: rpm.map((r) => (lbft * r) / HP_CONSTANT), afr: {} };
}

let sequence = 0;

export function engineRun(over: Partial<EngineRun> & { id: string }): EngineRun {
  sequence += 1;
  return {
    label: null,
    sequence,
    status: 'ready',
    curve: flatTorque(100),
    correctionStandard: 'none',
    correctionFactor: 1,
    conditions: null,
    identityStatus: 'ok',
    createdAt: new Date(Date.UTC(2026, 0, 1, 12, 0, sequence)),
    bike: { id: 'bike-1', make: 'Acme', model: 'Sprint', year: 2021 },
    stage: null,
    session: { id: 'session-1', startedAt: new Date(Date.UTC(2026, 0, 1, 9)), ambientTempC: null, baroKpa: null, humidityPct: null, dyno: { id: 'dyno-1', name: 'Bay 1' } },
    ...over,
  };
}
