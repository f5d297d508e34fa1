import type { CorrectionId, RunDetailDto } from '@shared/schemas/run';
import { correctionFactor } from '@server/analysis/correction';
import { hpTo, lbftTo } from '@server/analysis/units';

export type PowerChoice = 'hp' | 'kw';
export type TorqueChoice = 'lbft' | 'nm';
export const POWER_LABEL: Record<PowerChoice, 'hp' | 'kW'> = { hp: 'hp', kw: 'kW' };
export const TORQUE_LABEL: Record<TorqueChoice, 'lb·ft' | 'N·m'> = { lbft: 'lb·ft', nm: 'N·m' };

export interface DisplayCurve {
  rpm: number[];
  power: number[];
  torque: number[];
  afr: Record<string, number[]>;
  /** The factor applied (1 when uncorrected or when it could not be computed). */
  factor: number;
  /** Why the chosen standard could not be applied, in plain words. */
  problem: string | null;
  peakPower: { value: number; rpm: number } | null;
  peakTorque: { value: number; rpm: number } | null;
}

/**
 * The stored curve is uncorrected and in lb·ft / hp. Correction is recomputed here from the run's
 * conditions so switching standards never needs the server; units are converted last.
 */
export function displayCurve(run: Pick<RunDetailDto, 'curve' | 'conditions'>, standard: CorrectionId, power: PowerChoice, torque: TorqueChoice): DisplayCurve | null {
  const c = run.curve;
  if (!c || c.rpm.length === 0) return null;
  let factor = 1;
  let problem: string | null = null;
  if (standard !== 'none') {
    try {
      factor = correctionFactor(standard, {
        temperatureC: num(run.conditions?.temperatureC),
        baroKpa: num(run.conditions?.baroKpa),
        humidityPct: num(run.conditions?.humidityPct),
      });
    } catch (e) {
      problem = e instanceof Error ? e.message : 'The correction could not be computed.';
      factor = 1;
    }
  }
  const p = c.powerHp.map((v) => hpTo(v * factor, power));
  const t = c.torqueLbft.map((v) => lbftTo(v * factor, torque));
  return { rpm: c.rpm, power: p, torque: t, afr: c.afr ?? {}, factor, problem, peakPower: peak(c.rpm, p), peakTorque: peak(c.rpm, t) };
}

function num(v: unknown): number | undefined {
  return typeof v === 'number' && Number.isFinite(v) ? v : undefined;
}

function peak(rpm: number[], values: number[]): { value: number; rpm: number } | null {
  let best = -1;
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i]) && (best < 0 || values[i] > values[best])) best = i;
  return best < 0 ? null : { value: values[best], rpm: rpm[best] };
}
