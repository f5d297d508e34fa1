import { z } from 'zod';
import { optionalEmail, optionalText, requiredText } from './common';
import { UNIT_SYSTEMS, type UnitSystem } from '../units-display';

/** Atmospheric correction standards a shop may choose as its default for new comparisons and reports. */
export const CORRECTION_STANDARDS = ['none', 'sae-j1349', 'sae-j1349-1990', 'iso-1585', 'din-70020', 'sae-j607'] as const;
export type CorrectionStandard = (typeof CORRECTION_STANDARDS)[number];

/** Shop settings form and PUT /api/shop. Identical to the server's schema so both sides agree. */
export const shopSettingsInput = z.object({
  name: requiredText(200, 'Shop name'),
  address: optionalText(1000),
  phone: optionalText(60),
  email: optionalEmail,
  units: z.enum(UNIT_SYSTEMS),
  paperSize: z.enum(['letter', 'a4']),
  defaultCorrection: z.enum(CORRECTION_STANDARDS),
});
export type ShopSettingsValues = z.input<typeof shopSettingsInput>;

/** What GET /api/shop and PUT /api/shop answer. */
export interface ShopDto {
  id: string;
  name: string;
  address: string | null;
  phone: string | null;
  email: string | null;
  hasLogo: boolean;
  units: UnitSystem;
  paperSize: 'letter' | 'a4';
  defaultCorrection: CorrectionStandard;
}
