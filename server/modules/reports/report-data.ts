/**
 * What a gain report says, as plain data: built once from the comparison when a report version is
 * generated, stored with the version (Report.summary), printed by the PDF and shown by the share
 * page. Power and torque are always kept in hp and lb·ft here; the PDF converts to the shop's units.
 */
import type { PaperSize, UnitSystem } from '../shops/shop.entity';

export interface ReportRun {
  id: string;
  label: string;
  stageName: string | null;
  isBaseline: boolean;
  /** Index in the comparison (0 = baseline): picks the run's colour, as on screen. */
  colorIndex: number;
  recordedAt: string | null;
  dynoName: string | null;
  dynoKind: string | null;
  conditions: { temperatureC: number | null; baroKpa: number | null; humidityPct: number | null };
  correctionStandard: string;
  correctionLabel: string;
  correctionFactor: number | null;
  /** Corrected peaks. */
  peakPower: { hp: number; rpm: number };
  peakTorque: { lbft: number; rpm: number };
}

export interface ReportGain {
  runId: string;
  peakPowerGain: { hp: number; pct: number };
  peakTorqueGain: { lbft: number; pct: number };
  areaGainPct: number;
  averagePowerGainHp: number;
  bands: { from: number; to: number; averagePowerGainHp: number }[];
  largestGain: { rpm: number; hp: number };
  largestLoss: { rpm: number; hp: number };
}

export interface ReportCurve {
  runId: string;
  rpm: number[];
  powerHp: number[];
  torqueLbft: number[];
}

export interface ReportStage {
  name: string;
  date: string | null;
  isBaseline: boolean;
  parts: { category: string; description: string; partCostCents: number; labourCostCents: number }[];
  totalCostCents: number;
}

export interface ReportData {
  number: string;
  version: number;
  createdAt: string;
  shop: { name: string; address: string | null; phone: string | null; email: string | null };
  units: UnitSystem;
  paperSize: PaperSize;
  customer: { name: string };
  bike: { make: string; model: string; year: number | null; vin: string | null; engineFamily: string | null; displacementCc: number | null };
  comparison: { id: string; name: string };
  runs: ReportRun[];
  /** One per run other than the baseline, in run order. */
  gains: ReportGain[];
  /** Corrected curves, aligned as the comparison aligned them. */
  curves: ReportCurve[];
  stages: ReportStage[];
  repeatability: { text: string; runs: number; peakPowerSpreadHp: number | null } | null;
  /** Cost of the work after the baseline against the final run's peak power gain. */
  cost: { totalCostCents: number; gainHp: number } | null;
  warnings: string[];
  /** One or two plain sentences. */
  summary: string;
  technicianNote: string | null;
}

/** The id of the run the headline figures are about: the last run that is not the baseline. */
export function headlineGain(data: Pick<ReportData, 'gains'>): ReportGain | null {
  return data.gains.length ? data.gains[data.gains.length - 1] : null;
}
