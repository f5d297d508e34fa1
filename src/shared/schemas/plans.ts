/**
 * Build plans: a priced offer for a bike's next stage with the archive's expected gain, accepted
 * online and secured with a deposit. Input schemas (the plan editor's form uses the same ones)
 * and every answer's DTO type. Money is always integer cents in the shop's currency.
 */
import { z } from 'zod';
import { HEAD_WORK_LEVELS, PART_CATEGORIES, type HeadWorkLevel, type PartCategory } from '../parts';
import { optionalText, uuid } from './common';
import type { Spread, TypicalBuildDto } from './builds';

export const PLAN_STATUSES = ['draft', 'sent', 'accepted', 'declined', 'expired', 'converted'] as const;
export type PlanStatus = (typeof PLAN_STATUSES)[number];

/** Whole cents, 0 … 10,000,000 (100,000.00 in the shop's currency). */
const cents = (label: string) =>
  z.coerce
    .number({ invalid_type_error: `${label} must be a number` })
    .int(`${label} must be whole cents`)
    .min(0, `${label} cannot be negative`)
    .max(10_000_000, `${label} is too large`);

export const planItemInput = z.object({
  category: z.enum(PART_CATEGORIES),
  description: z.string().trim().min(1, 'Describe the part or job').max(500),
  partCostCents: cents('Part cost'),
  labourCostCents: cents('Labour cost'),
  /** Only for cylinder-head work; ignored on other categories. */
  headWork: z.preprocess((v) => (v === '' ? null : v), z.enum(HEAD_WORK_LEVELS).nullish()),
});
export type PlanItemInput = z.output<typeof planItemInput>;

/** POST /api/bikes/:id/plans and PUT /api/plans/:id (while draft). */
export const planInput = z.object({
  title: z.string().trim().min(1, 'Title is required').max(200),
  items: z.array(planItemInput).min(1, 'Add at least one item').max(50),
  note: optionalText(2000),
});
export type PlanInput = z.output<typeof planInput>;
export type PlanFormValues = z.input<typeof planInput>;

/** Money typed in the plan editor, in the currency's main unit → whole cents (1.005 → 101: cut to 6 decimals first). */
const moneyInput = (label: string) =>
  z
    .preprocess(
      (v) => (v === '' || v === null || v === undefined || (typeof v === 'number' && Number.isNaN(v)) ? 0 : typeof v === 'string' ? Number(v) : v),
      z.number({ invalid_type_error: `${label} must be a number` }).min(0, `${label} cannot be negative`).max(100_000, `${label} is too large`),
    )
    .transform((v) => Math.round(Number((v * 100).toFixed(6))));

/** The plan editor's form: costs typed in money, sent as PlanInput (cents). */
export const planFormInput = z.object({
  title: planInput.shape.title,
  note: planInput.shape.note,
  items: z
    .array(
      z
        .object({ category: z.enum(PART_CATEGORIES), description: planItemInput.shape.description, partCost: moneyInput('Part cost'), labourCost: moneyInput('Labour cost'), headWork: planItemInput.shape.headWork })
        .transform(({ partCost, labourCost, ...rest }) => ({ ...rest, partCostCents: partCost, labourCostCents: labourCost })),
    )
    .min(1, 'Add at least one item')
    .max(50),
});
export type PlanEditorValues = z.input<typeof planFormInput>;

export const planSendInput = z.object({
  /** Defaults to the customer's e-mail on record. */
  to: z.string().trim().email('Enter a valid e-mail address').optional(),
  /** Days the offer stays open; then it expires. */
  validDays: z.coerce.number().int().min(1).max(180).default(30),
});

export const planAcceptInput = z.object({
  name: z.string().trim().min(2, 'Type your full name to accept').max(200),
});
export const planDeclineInput = z.object({ reason: optionalText(2000) });
export const planRefundInput = z.object({ reason: optionalText(500) });
/** POST /api/plans/:id/convert: the stage the accepted plan becomes. */
export const planConvertInput = z.object({
  /** Stage name; the plan's title when left out. */
  name: z.string().trim().min(1).max(120).optional(),
  date: z.string().date().nullish(),
});
export const planTokenParams = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'Not a valid link') });
export const planListQuery = z.object({ bikeId: uuid.optional() });

export interface PlanItemDto {
  category: PartCategory;
  description: string;
  partCostCents: number;
  labourCostCents: number;
  headWork: HeadWorkLevel | null;
}

/** Median and interquartile range of the gain at each rpm, over this bike's latest reference run. */
export interface PredictionBandDto {
  /** The run the band is drawn over, and its label. */
  baseRunId: string;
  baseLabel: string;
  rpm: number[];
  basePowerHp: number[];
  gainMedianHp: number[];
  gainQ1Hp: number[];
  gainQ3Hp: number[];
  /** How many builds cover each rpm point (the band is left out where fewer than 2 do). */
  builds: number[];
}

/**
 * What the archive says the planned work added on similar builds. `kind`: `single` (one
 * category: the finder's typical outcome, same figures), `combination` (builds whose stage added
 * every planned category), `estimate` (too few of those: the sum of single-category medians),
 * `none` (nothing to go on).
 */
export interface PlanPredictionDto {
  kind: 'single' | 'combination' | 'estimate' | 'none';
  /** Part keys the prediction was made for ('category' or 'cylinder-heads:level'). */
  keys: string[];
  criteria: string;
  count: number;
  peakPowerGainHp: Spread | null;
  averagePowerGainHp: Spread | null;
  /** Only for kind 'estimate': the sum of single-category medians, and what it is made of. */
  estimate: { peakPowerGainHp: number; averagePowerGainHp: number | null; parts: { key: string; count: number; medianPeakHp: number | null }[] } | null;
  /** The plan's total divided by the median peak gain (or the estimate); null without a positive gain. */
  costPerHpCents: number | null;
  lowConfidence: boolean;
  message: string;
  disclaimer: string;
  quantileMethod: string;
  builds: TypicalBuildDto[];
  band: PredictionBandDto | null;
}

/** Predicted against measured, once the converted stage has a reference run. */
export interface PlanOutcomeDto {
  stageId: string;
  stageName: string;
  measuredPeakPowerGainHp: number | null;
  measuredAveragePowerGainHp: number | null;
  predictedMedianPeakHp: number | null;
  predictedQ1PeakHp: number | null;
  predictedQ3PeakHp: number | null;
  /** Where the measured step fell: below, inside or above the predicted middle half. */
  position: 'below' | 'within' | 'above' | 'no-prediction' | 'not-measured';
}

export interface PlanDto {
  id: string;
  bikeId: string;
  bikeLabel: string;
  customerName: string;
  title: string;
  note: string | null;
  status: PlanStatus;
  /** 0 while never sent; each send makes a new version. */
  version: number;
  items: PlanItemDto[];
  totalCostCents: number;
  currency: string;
  prediction: PlanPredictionDto;
  sentAt: string | null;
  validUntil: string | null;
  acceptedAt: string | null;
  acceptedName: string | null;
  acceptedVersion: number | null;
  declinedAt: string | null;
  declineReason: string | null;
  depositCents: number;
  depositPaidCents: number;
  depositRefundedCents: number;
  convertedStageId: string | null;
  outcome: PlanOutcomeDto | null;
  createdAt: string;
  updatedAt: string;
}

/** POST /api/plans/:id/send. */
export interface PlanSendDto {
  plan: PlanDto;
  to: string;
  /** The customer's plan link (the token is only ever in this answer and the e-mail). */
  url: string;
}

/** What a plan link shows: the plan and the shop's name. */
export interface PublicPlanDto {
  shopName: string;
  plan: PlanDto;
  pdfUrl: string;
}

export interface DepositCheckoutDto {
  url: string;
}

export interface PlanVersionDto {
  version: number;
  sentAt: string;
  sentTo: string;
  totalCostCents: number;
  depositCents: number;
}

/** Shop deposit rule (shop settings). */
export const DEPOSIT_MODES = ['off', 'percent', 'fixed'] as const;
export type DepositMode = (typeof DEPOSIT_MODES)[number];
