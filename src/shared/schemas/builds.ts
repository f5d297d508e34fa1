/**
 * Shapes the build finder answers with. Types only (no runtime code), so the client can
 * `import type` them without pulling server code into its bundle.
 */
import type { HeadWorkLevel, PartCategory } from '@shared/parts';

export interface BuildPartDto {
  category: PartCategory;
  description: string;
  headWorkLevel: HeadWorkLevel | null;
  /** Fitted at this stage (true) or at an earlier stage of the same bike (false). */
  addedInThisStage: boolean;
  costCents: number;
}

/** One build: a bike at one measured stage, with its gains against that bike's baseline. */
export interface BuildItemDto {
  bikeId: string;
  stageId: string;
  stageName: string;
  stagePosition: number;
  /** Stage date (or the day it was recorded), YYYY-MM-DD. */
  date: string;
  make: string;
  model: string;
  year: number | null;
  engineFamily: string | null;
  displacementCc: number | null;
  cylinders: number | null;
  customerId: string;
  customerName: string;
  /** Against the bike's baseline stage (stage.gain_* columns). */
  peakPowerGainHp: number | null;
  peakTorqueGainLbft: number | null;
  areaGainPct: number | null;
  averagePowerGainHp: number | null;
  /** What this stage's own parts and labour cost. */
  costCents: number;
  /** Everything fitted from the first stage up to and including this one. */
  cumulativeCostCents: number;
  /** The cumulative build: parts of this stage and of every earlier stage. */
  parts: BuildPartDto[];
  /** Ranking score of the search (0 when nothing fuzzy was asked for). */
  score: number;
}

export interface BuildSearchPage {
  items: BuildItemDto[];
  /** Opaque cursor for the next page, or null at the end. */
  next: string | null;
  sort: 'similarity' | 'gain' | 'date';
}

export interface SimilarBuildDto extends BuildItemDto {
  /** Weighted similarity, 0…1 (see build-similar.service.ts for the formula). */
  similarity: number;
  /** Each component of the score, 0…1, before weighting. */
  components: { engineFamily: number; displacement: number; partCategories: number; partsText: number };
  /** Plain reasons: "same engine family", "within 5 % displacement", "also has: camshaft, cylinder heads". */
  reasons: string[];
}

export interface SimilarBuildsDto {
  bikeId: string;
  weights: { engineFamily: number; displacement: number; partCategories: number; partsText: number };
  items: SimilarBuildDto[];
}

export interface Spread {
  min: number;
  q1: number;
  median: number;
  q3: number;
  max: number;
}

export interface TypicalBuildDto {
  bikeId: string;
  stageId: string;
  make: string;
  model: string;
  engineFamily: string | null;
  displacementCc: number | null;
  stageName: string;
  date: string;
  peakPowerGainHp: number;
  averagePowerGainHp: number | null;
  costCents: number;
}

export interface TypicalOutcomeDto {
  bikeId: string;
  category: PartCategory;
  level: HeadWorkLevel | null;
  /** How "similar builds" were chosen, in words. */
  criteria: string;
  count: number;
  /** Per-stage increments (that stage against the stage measured before it), in hp. */
  peakPowerGainHp: Spread | null;
  averagePowerGainHp: Spread | null;
  costCents: { min: number; median: number; max: number } | null;
  lowConfidence: boolean;
  /** A plain sentence for the screen and the quote. */
  message: string;
  /** Always shown with the figures. */
  disclaimer: string;
  quantileMethod: string;
  builds: TypicalBuildDto[];
}
