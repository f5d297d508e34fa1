/**
 * The reports API, shared by the server (validation, the stored report data, the PDF) and the client
 * (forms, screens). Power and torque are always hp and lb·ft in these shapes; screens and the PDF
 * convert to the shop's units.
 */
import { z } from 'zod';
import { optionalText, uuid } from './common';
import type { UnitSystem } from '../units-display';

export type ReportUnits = UnitSystem;
export type ReportPaperSize = 'letter' | 'a4';

/** Days a new share link stays valid unless the sender picks another. */
export const DEFAULT_SHARE_DAYS = 30;

// ---- request bodies and queries

export const reportInput = z.object({ comparisonId: uuid, technicianNote: optionalText(3000).optional() });
export type ReportInput = z.infer<typeof reportInput>;
export const reportListQuery = z.object({ bikeId: uuid.optional(), comparisonId: uuid.optional() });
export const sendInput = z.object({
  to: z.string({ required_error: 'Recipient is required' }).trim().toLowerCase().email('Enter a valid e-mail address').max(320, 'At most 320 characters'),
  message: z.string({ required_error: 'Message is required' }).trim().min(1, 'Message is required').max(5000, 'At most 5,000 characters'),
});
export type SendInput = z.infer<typeof sendInput>;
export const shareInput = z.object({ expiresInDays: z.coerce.number().int().min(1, 'At least 1 day').max(365, 'At most 365 days').default(DEFAULT_SHARE_DAYS) });
export type ShareInput = z.infer<typeof shareInput>;

// ---- what a report says (stored with each version as Report.summary)

export interface ReportRun {
  id: string;
  /** The run's name (src/shared/labels.ts runName). */
  label: string;
  /** Its file as secondary text (runFileLabel); absent in reports made before it was stored. */
  fileName?: string | null;
  stageName: string | null;
  isBaseline: boolean;
  /** The run's colour slot, from its place in its bike's archive (server/modules/comparisons/run-colors.ts). */
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

/**
 * The cost behind the headline gain: every stage after the baseline's stage up to the compared
 * run's stage, in build order — also stages in between that had no run in the comparison.
 */
export interface ReportCost {
  totalCostCents: number;
  /** Peak power gain of the compared run against the baseline (hp). */
  gainHp: number;
  /** The baseline's stage (older reports: absent). */
  fromStageName?: string;
  /** The stages whose cost is counted, in build order (older reports: absent). */
  stageNames?: string[];
}

export interface ReportData {
  number: string;
  version: number;
  createdAt: string;
  shop: { name: string; address: string | null; phone: string | null; email: string | null };
  units: ReportUnits;
  paperSize: ReportPaperSize;
  /** The shop's IANA zone for printed dates; reports made before it was kept print UTC. */
  timeZone?: string;
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
  cost: ReportCost | null;
  warnings: string[];
  /** One or two plain sentences. */
  summary: string;
  technicianNote: string | null;
}

// ---- answers

export interface ReportSummary {
  id: string;
  number: string;
  version: number;
  bikeId: string;
  bikeLabel: string;
  comparisonId: string;
  comparisonName: string;
  createdAt: string;
  createdByName: string | null;
  technicianNote: string | null;
  pdfUrl: string;
  pdfSha256: string;
  pdfSizeBytes: number;
  headline: { peakPowerGain: string; areaGain: string } | null;
}

/** POST /api/reports: the version just generated. */
export interface ReportCreated {
  id: string;
  number: string;
  version: number;
  pdfUrl: string;
  pdfSha256: string;
}

export interface ReportDetail extends ReportSummary {
  customer: { id: string; name: string; email: string | null };
  data: ReportData;
  versions: ReportSummary[];
}

export interface Delivery {
  id: string;
  to: string;
  subject: string;
  message: string;
  /** queued: the mail relay was away; the mail queue keeps trying and the log follows. */
  status: 'queued' | 'sent' | 'failed';
  error: string | null;
  sentByName: string | null;
  createdAt: string;
  reportVersion: number;
}

export interface ShareLinkView {
  id: string;
  createdAt: string;
  expiresAt: string;
  revokedAt: string | null;
  viewCount: number;
  lastViewedAt: string | null;
  status: 'active' | 'expired' | 'revoked';
  reportVersion?: number;
  /** Only in the answer that created the link: the token is not stored and cannot be shown again. */
  url?: string;
}

/** The run fields the public share page gets. */
export type PublicShareRun = Pick<ReportRun, 'id' | 'label' | 'fileName' | 'isBaseline' | 'colorIndex' | 'correctionLabel' | 'peakPower' | 'peakTorque'>;

export interface PublicShare {
  shopName: string;
  number: string;
  version: number;
  createdAt: string;
  expiresAt: string;
  bikeLabel: string;
  units: ReportUnits;
  summary: string;
  warnings: string[];
  runs: PublicShareRun[];
  gains: ReportGain[];
  curves: ReportCurve[];
  pdfUrl: string;
}

/** "Stage 1, Stage 2 and Stage 3" — names joined for a sentence. */
function joinNames(names: string[]): string {
  return names.length <= 1 ? (names[0] ?? '') : `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

/**
 * Which work the report's cost counts, in plain words: "Stage 1, Stage 2 and Stage 3 (all work
 * after Baseline)". Reports made before the stages were recorded say "all work after the baseline".
 */
export function costCoverage(cost: Pick<ReportCost, 'stageNames' | 'fromStageName'>): string {
  if (!cost.stageNames?.length) return 'all work after the baseline';
  return `${joinNames(cost.stageNames)} (all work after ${cost.fromStageName ?? 'the baseline'})`;
}
