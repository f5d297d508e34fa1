import { z } from 'zod';

/** Text field that may be left blank: trims, and turns "" into null. */
export const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `At most ${max} characters`)
    .nullish()
    .transform((v) => (v ? v : null));

export const requiredText = (max: number, label: string) =>
  z.string({ required_error: `${label} is required` }).trim().min(1, `${label} is required`).max(max, `At most ${max} characters`);

export const optionalEmail = z
  .string()
  .trim()
  .max(320)
  .nullish()
  .transform((v) => (v ? v.toLowerCase() : null))
  .refine((v) => v === null || z.string().email().safeParse(v).success, 'Enter a valid e-mail address');

/** Number field that may be left blank (forms send "" or NaN for an empty input). */
export const optionalNumber = (opts: { min?: number; max?: number; int?: boolean; label: string }) =>
  z.preprocess(
    (v) => (v === '' || v === null || v === undefined || (typeof v === 'number' && Number.isNaN(v)) ? null : typeof v === 'string' ? Number(v) : v),
    z
      .number({ invalid_type_error: `${opts.label} must be a number` })
      .refine((n) => !opts.int || Number.isInteger(n), `${opts.label} must be a whole number`)
      .refine((n) => opts.min === undefined || n >= opts.min, `${opts.label} must be at least ${opts.min}`)
      .refine((n) => opts.max === undefined || n <= opts.max, `${opts.label} must be at most ${opts.max}`)
      .nullable(),
  );

export const uuid = z.string().uuid('Not a valid id');
export const idParams = z.object({ id: uuid });

/**
 * A yes/no query parameter. `z.coerce.boolean()` turns the text "false" into true; this reads
 * "true"/"1"/"yes" as true and "false"/"0"/"no"/"" as false, and refuses anything else.
 */
export const queryBoolean = z.preprocess((v) => {
  if (typeof v === 'boolean' || v === undefined) return v;
  const s = String(v).trim().toLowerCase();
  if (['true', '1', 'yes', 'on'].includes(s)) return true;
  if (['false', '0', 'no', 'off', ''].includes(s)) return false;
  return v;
}, z.boolean({ invalid_type_error: 'Use true or false' }));

/** Query of a server-side table: search text, sort ("field" or "-field"), page and size. */
export const listQuery = <S extends string>(sortable: readonly [S, ...S[]]) =>
  z.object({
    q: z.string().trim().max(200).optional(),
    sort: z
      .string()
      .optional()
      .refine((s) => !s || sortable.includes(s.replace(/^-/, '') as S), `Sort by one of: ${sortable.join(', ')}`),
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(200).default(25),
  });

/**
 * The one shape every list route answers with. `total` counts every matching row; `nextCursor`
 * is set by lists that page with a keyset cursor (pass it back as `cursor`) and null on the last page.
 */
export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
  nextCursor?: string | null;
  /** Set (true) when `total` is an estimate: lists that count exactly only up to a bound. */
  totalIsEstimate?: boolean;
}

/** A whole list in the page shape (lists that are short by nature: a bike's stages, a run's reports). */
export function wholePage<T>(items: T[]): Page<T> {
  return { items, total: items.length, page: 1, pageSize: Math.max(items.length, 1), nextCursor: null };
}

/** GET /api/health: up or down per dependency, nothing more (answered 503 when degraded). */
export interface HealthDto {
  status: 'ok' | 'degraded';
  database: { ok: boolean };
  storage: { ok: boolean };
}

/** The answer of an action that has nothing else to say (e.g. resending an invitation). */
export interface OkDto {
  ok: true;
}

export function parseSort(sort: string | undefined, fallback: string): { field: string; dir: 'asc' | 'desc' } {
  const s = sort || fallback;
  return s.startsWith('-') ? { field: s.slice(1), dir: 'desc' } : { field: s, dir: 'asc' };
}
