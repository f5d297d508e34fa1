/** Shapes of the reports API (server/modules/reports). Power and torque are hp and lb·ft. */
export type Units = 'imperial' | 'metric';

export interface ReportRunView {
  id: string;
  label: string;
  isBaseline: boolean;
  colorIndex: number;
  correctionLabel: string;
  peakPower: { hp: number; rpm: number };
  peakTorque: { lbft: number; rpm: number };
}

export interface ReportGainView {
  runId: string;
  peakPowerGain: { hp: number; pct: number };
  peakTorqueGain: { lbft: number; pct: number };
  areaGainPct: number;
  averagePowerGainHp: number;
  bands: { from: number; to: number; averagePowerGainHp: number }[];
  largestGain: { rpm: number; hp: number };
  largestLoss: { rpm: number; hp: number };
}

export interface ReportCurveView {
  runId: string;
  rpm: number[];
  powerHp: number[];
  torqueLbft: number[];
}

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

export interface ReportDetail extends ReportSummary {
  customer: { id: string; name: string; email: string | null };
  data: {
    units: Units;
    summary: string;
    warnings: string[];
    shop: { name: string };
    runs: ReportRunView[];
    gains: ReportGainView[];
    curves: ReportCurveView[];
  };
  versions: ReportSummary[];
}

export interface Delivery {
  id: string;
  to: string;
  subject: string;
  message: string;
  status: 'sent' | 'failed';
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

export interface PublicShare {
  shopName: string;
  number: string;
  version: number;
  createdAt: string;
  expiresAt: string;
  bikeLabel: string;
  units: Units;
  summary: string;
  warnings: string[];
  runs: ReportRunView[];
  gains: ReportGainView[];
  curves: ReportCurveView[];
  pdfUrl: string;
}
