import type { CorrectionId, RunDetailDto } from '@shared/schemas/run';
import { correctionFactor } from '@shared/analysis/correction';
import { GASOLINE_STOICH_AFR, hpTo, lbftTo } from '@shared/analysis/units';
import { formatNumber } from '@shared/format';

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

/** How the mixture panel reads: air–fuel ratio, or lambda (AFR ÷ stoichiometric AFR). */
export type MixtureChoice = 'afr' | 'lambda';

export interface MixtureChannel {
  /** The stored channel key, e.g. "lambda1 (AFR)". */
  key: string;
  /** What the legend and tooltip say, e.g. "Lambda 1 → AFR (×14.7)". */
  label: string;
  values: number[];
}

/** "lambda1" → "Lambda 1", "afr_front" → "Afr front": a header as a legend label. */
function prettyHeader(header: string): string {
  const spaced = header
    .replace(/[_]+/g, ' ')
    .replace(/([a-zA-Z])(\d)/g, '$1 $2')
    .trim();
  return spaced ? spaced[0].toUpperCase() + spaced.slice(1) : header;
}

const STOICH = formatNumber(GASOLINE_STOICH_AFR, { decimals: 1 });

/**
 * The mixture channels as the panel shows them. The stored curve holds every channel as AFR; a
 * channel the file recorded as lambda was multiplied by the gasoline stoichiometric ratio (14.7,
 * common practice for petrol) and is keyed "<header> (AFR)". The labels say which conversion was
 * made, and in lambda mode every channel is divided by the same ratio.
 */
export function mixtureChannels(afr: Record<string, number[]>, mode: MixtureChoice): MixtureChannel[] {
  return Object.entries(afr).map(([key, values]) => {
    const fromLambda = key.endsWith(' (AFR)');
    const header = prettyHeader(fromLambda ? key.slice(0, -' (AFR)'.length) : key);
    if (mode === 'afr') return { key, label: fromLambda ? `${header} → AFR (×${STOICH})` : header, values };
    return { key, label: fromLambda ? `${header} (lambda)` : `${header} → lambda (÷${STOICH})`, values: values.map((v) => v / GASOLINE_STOICH_AFR) };
  });
}
