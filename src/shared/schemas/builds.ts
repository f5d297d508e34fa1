/**
 * The build finder's request schemas (shared by the finder's filter form and, in time, the
 * server's GET /api/builds/search) and the shapes it answers with. Only zod and shared lists
 * at run time, so the client bundle pulls in no server code.
 */
import { z } from 'zod';
import { HEAD_WORK_LEVELS, PART_CATEGORIES, type HeadWorkLevel, type PartCategory } from '../parts';
import { uuid, type Page } from './common';

// ---- request: GET /api/builds/search

/** "a,b" or ["a","b"] or "a" → ["a","b"]; blank → []. */
const csvList = <T extends z.ZodTypeAny>(item: T) =>
  z.preprocess((v) => {
    if (v === undefined || v === null || v === '') return [];
    const list = Array.isArray(v) ? v : [v];
    return list.flatMap((x) => String(x).split(',')).map((s) => s.trim()).filter(Boolean);
  }, z.array(item).max(20));

const optNum = (label: string, min = 0, max = 100_000) =>
  z.preprocess(
    (v) => (v === '' || v === undefined || v === null ? undefined : Number(v)),
    z
      .number({ invalid_type_error: `${label} must be a number` })
      .min(min, `${label} must be at least ${min}`)
      .max(max, `${label} must be at most ${max}`)
      .optional(),
  );

const optText = (max: number) => z.preprocess((v) => (typeof v === 'string' && v.trim() === '' ? undefined : v), z.string().trim().max(max, `At most ${max} characters`).optional());

/** A real calendar day (no 30 February), years 1900–2999 (the archive's span, our choice). */
const realDay = (v: string) => {
  const [y, m, d] = v.split('-').map(Number);
  const date = new Date(Date.UTC(y, m - 1, d));
  return y >= 1900 && y <= 2999 && date.getUTCFullYear() === y && date.getUTCMonth() === m - 1 && date.getUTCDate() === d;
};
const isoDate = z.preprocess((v) => (v === '' ? undefined : v), z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use YYYY-MM-DD').refine(realDay, 'Not a real date (YYYY-MM-DD, years 1900–2999)').optional());

export const BUILD_SORTS = ['similarity', 'gain', 'date'] as const;
export type BuildSort = (typeof BUILD_SORTS)[number];

/** Displacement limits of a search, per unit (20,000 cm³ ≈ 1,220 in³; in³ allows a little more). */
export const DISPLACEMENT_LIMITS = { cc: 20_000, ci: 1_500 } as const;

/** Query of GET /api/builds/search: every value arrives as a string (or a list) from the URL. */
export const buildSearchQuery = z.object({
  engine: optText(100),
  make: optText(100),
  model: optText(100),
  ccMin: optNum('ccMin', 0, DISPLACEMENT_LIMITS.cc),
  ccMax: optNum('ccMax', 0, DISPLACEMENT_LIMITS.cc),
  ciMin: optNum('ciMin', 0, DISPLACEMENT_LIMITS.ci),
  ciMax: optNum('ciMax', 0, DISPLACEMENT_LIMITS.ci),
  cylinders: optNum('cylinders', 1, 16).refine((n) => n === undefined || Number.isInteger(n), 'cylinders must be a whole number'),
  parts: csvList(z.enum(PART_CATEGORIES)),
  headLevel: z.preprocess((v) => (v === '' ? undefined : v), z.enum(HEAD_WORK_LEVELS).optional()),
  partText: optText(200),
  q: optText(200),
  tag: csvList(z.string().trim().min(1).max(60)),
  from: isoDate,
  to: isoDate,
  customerId: z.preprocess((v) => (v === '' ? undefined : v), uuid.optional()),
  sort: z.preprocess((v) => (v === '' ? undefined : v), z.enum(BUILD_SORTS).optional()),
  limit: z.coerce.number().int().min(1).max(100).default(25),
  cursor: optText(500),
});
export type BuildSearchQuery = z.output<typeof buildSearchQuery>;

/** GET /api/bikes/:id/similar */
export const similarQuery = z.object({
  limit: z.coerce.number().int().min(1).max(50).default(20),
});

/** GET /api/builds/typical: a planned modification on a bike. */
export const typicalQuery = z.object({
  bikeId: uuid,
  category: z.enum(PART_CATEGORIES),
  level: z.preprocess((v) => (v === '' ? undefined : v), z.enum(HEAD_WORK_LEVELS).optional()),
});
export type TypicalQuery = z.output<typeof typicalQuery>;

/** An optional number typed in a form box: blank is "not set"; the text is kept for the URL. */
const formNumber = (label: string, opts: { min: number; max?: number; int?: boolean }) =>
  z
    .string()
    .trim()
    .superRefine((v, ctx) => {
      if (v === '') return;
      const n = Number(v);
      const problem = !Number.isFinite(n)
        ? `${label} must be a number`
        : opts.int && !Number.isInteger(n)
          ? `${label} must be a whole number`
          : n < opts.min
            ? `${label} must be at least ${opts.min}`
            : opts.max !== undefined && n > opts.max
              ? `${label} must be at most ${opts.max}`
              : null;
      if (problem) ctx.addIssue({ code: z.ZodIssueCode.custom, message: problem });
    });

/**
 * The finder's filter form. Same limits as `buildSearchQuery`, in the words the form uses;
 * displacement is typed in one unit and sent as ccMin/ccMax or ciMin/ciMax.
 */
export const buildSearchForm = z
  .object({
    q: z.string().trim().max(200, 'At most 200 characters'),
    engine: z.string().trim().max(100, 'At most 100 characters'),
    partText: z.string().trim().max(200, 'At most 200 characters'),
    make: z.string().trim().max(100, 'At most 100 characters'),
    model: z.string().trim().max(100, 'At most 100 characters'),
    cylinders: formNumber('Cylinders', { min: 1, max: 16, int: true }),
    dMin: formNumber('Displacement', { min: 0 }),
    dMax: formNumber('Displacement', { min: 0 }),
    unit: z.enum(['cc', 'ci']),
    tag: z.string().trim().max(60, 'At most 60 characters'),
    from: z.union([z.literal(''), z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use YYYY-MM-DD')]),
    to: z.union([z.literal(''), z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use YYYY-MM-DD')]),
    parts: z.array(z.enum(PART_CATEGORIES)).max(20),
    headLevel: z.union([z.literal(''), z.enum(HEAD_WORK_LEVELS)]),
  })
  .superRefine((f, ctx) => {
    const limit = DISPLACEMENT_LIMITS[f.unit];
    const unitName = f.unit === 'ci' ? 'in³' : 'cm³';
    for (const key of ['dMin', 'dMax'] as const) {
      if (f[key] !== '' && Number(f[key]) > limit) ctx.addIssue({ code: z.ZodIssueCode.custom, path: [key], message: `At most ${limit.toLocaleString('en-US')} ${unitName}` });
    }
    if (f.dMin !== '' && f.dMax !== '' && Number(f.dMin) > Number(f.dMax)) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['dMax'], message: 'The upper displacement is below the lower one' });
    }
    if (f.from && f.to && f.from > f.to) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['to'], message: 'The end date is before the start date' });
  });
export type BuildSearchFormValues = z.input<typeof buildSearchForm>;

// ---- responses

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

/**
 * GET /api/builds/search: keyset pages. `nextCursor` is opaque (pass it back as `cursor`), null
 * at the end; `total` counts every matching build; `page` stays 1 (keyset paging has no page numbers).
 */
export interface BuildSearchPage extends Page<BuildItemDto> {
  nextCursor: string | null;
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

/** GET /api/bikes/:id/similar: the best-ranked builds, whole (a top list, not paged further). */
export interface SimilarBuildsDto extends Page<SimilarBuildDto> {
  bikeId: string;
  weights: { engineFamily: number; displacement: number; partCategories: number; partsText: number };
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
