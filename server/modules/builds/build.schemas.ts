import { z } from 'zod';
import { HEAD_WORK_LEVELS, PART_CATEGORIES } from '@shared/parts';
import { uuid } from '@shared/schemas/common';

/** "a,b" or ["a","b"] or "a" → ["a","b"]; blank → []. */
const csvList = <T extends z.ZodTypeAny>(item: T) =>
  z.preprocess((v) => {
    if (v === undefined || v === null || v === '') return [];
    const list = Array.isArray(v) ? v : [v];
    return list.flatMap((x) => String(x).split(',')).map((s) => s.trim()).filter(Boolean);
  }, z.array(item).max(20));

const optNum = (label: string, min = 0, max = 100_000) =>
  z.preprocess((v) => (v === '' || v === undefined || v === null ? undefined : Number(v)), z.number({ invalid_type_error: `${label} must be a number` }).min(min).max(max).optional());

const optText = (max: number) =>
  z.preprocess((v) => (typeof v === 'string' && v.trim() === '' ? undefined : v), z.string().trim().max(max).optional());

const isoDate = z.preprocess((v) => (v === '' ? undefined : v), z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use YYYY-MM-DD').optional());

export const BUILD_SORTS = ['similarity', 'gain', 'date'] as const;

export const buildSearchQuery = z.object({
  engine: optText(100),
  make: optText(100),
  model: optText(100),
  ccMin: optNum('ccMin', 0, 20_000),
  ccMax: optNum('ccMax', 0, 20_000),
  ciMin: optNum('ciMin', 0, 1_500),
  ciMax: optNum('ciMax', 0, 1_500),
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

export const similarQuery = z.object({
  limit: z.coerce.number().int().min(1).max(50).default(20),
});

export const typicalQuery = z.object({
  bikeId: uuid,
  category: z.enum(PART_CATEGORIES),
  level: z.preprocess((v) => (v === '' ? undefined : v), z.enum(HEAD_WORK_LEVELS).optional()),
});
export type TypicalQuery = z.output<typeof typicalQuery>;
