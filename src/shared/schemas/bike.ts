import { z } from 'zod';
import { listQuery, optionalNumber, optionalText, requiredText, uuid } from './common';
import { VIN_MESSAGES, vinProblem } from '../vin';
import { toCc } from '../displacement';

/** The latest model year a bike may have: makers sell next year's models from mid-year. Read at validation time. */
export const latestModelYear = (now: Date = new Date()) => now.getFullYear() + 1;

/** The owner customer; an empty choice gets a plain message instead of "Not a valid id". */
const OWNER_MESSAGE = "Choose the bike's owner";
const ownerId = z.string({ required_error: OWNER_MESSAGE }).uuid(OWNER_MESSAGE);

/**
 * Create or edit a bike. Displacement may be entered in cm³ or cubic inches; the parsed value
 * carries `displacementCc` only, so the server never stores anything else.
 */
export const bikeFormSchema = z.object({
  customerId: ownerId,
  make: requiredText(100, 'Make'),
  model: requiredText(100, 'Model'),
  year: optionalNumber({ label: 'Year', min: 1900, int: true }).superRefine((year, ctx) => {
    const latest = latestModelYear();
    if (year !== null && year > latest) ctx.addIssue({ code: z.ZodIssueCode.custom, message: `Model year cannot be later than ${latest}` });
  }),
  vin: z
    .string()
    .trim()
    .toUpperCase()
    .nullish()
    .transform((v) => (v ? v : null))
    .superRefine((v, ctx) => {
      const problem = v ? vinProblem(v) : null;
      if (problem) ctx.addIssue({ code: z.ZodIssueCode.custom, message: VIN_MESSAGES[problem] });
    }),
  engineFamily: optionalText(100),
  displacement: optionalNumber({ label: 'Displacement', min: 1, max: 10000 }),
  displacementUnit: z.enum(['cc', 'ci']).default('cc'),
  cylinders: optionalNumber({ label: 'Cylinders', min: 1, max: 16, int: true }),
  notes: optionalText(5000),
});

export const bikeInput = bikeFormSchema
  .superRefine((b, ctx) => {
    if (b.displacement !== null && b.displacementUnit === 'ci' && b.displacement > 610) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['displacement'], message: 'That is more than 10,000 cm³; check the unit' });
    }
  })
  .transform(({ displacement, displacementUnit, ...rest }) => ({
    ...rest,
    displacementCc: displacement === null ? null : Math.round(toCc(displacement, displacementUnit) * 100) / 100,
  }));
export type BikeFormValues = z.input<typeof bikeFormSchema>;
export type BikeInput = z.output<typeof bikeInput>;

export const BIKE_SORTS = ['make', 'model', 'year', 'createdAt', 'customer', 'displacementCc'] as const;
export const bikeListQuery = listQuery(BIKE_SORTS).extend({ customerId: uuid.optional() });

export interface BikeDto {
  id: string;
  customerId: string;
  customerName: string;
  make: string;
  model: string;
  year: number | null;
  vin: string | null;
  engineFamily: string | null;
  displacementCc: number | null;
  cylinders: number | null;
  notes: string | null;
  createdAt: string;
}
