import { z } from 'zod';
import { optionalEmail, optionalText, requiredText } from './common';
import { UNIT_SYSTEMS, type UnitSystem } from '../units-display';
import { DEPOSIT_MODES, type DepositMode } from './plans';
import { isTimeZone } from '../time-zone';

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
  /** IANA zone ("America/Denver") of the shop's calendar day. Left out: unchanged. */
  timeZone: z.string().trim().refine(isTimeZone, 'Choose a time zone from the list').optional(),
  /** ISO 4217 code; amounts are kept in its minor unit (cents). Left out: unchanged. */
  currency: z.string().trim().toLowerCase().regex(/^[a-z]{3}$/, 'Use a three-letter currency code, e.g. USD').optional(),
  /** Deposit asked on an accepted build plan: off, a percentage of the plan, or a fixed amount. Left out: unchanged. */
  depositMode: z.enum(DEPOSIT_MODES).optional(),
  depositPercent: z.coerce.number().int('Whole percent').min(0).max(100, 'At most 100 %').optional(),
  depositFixedCents: z.coerce.number().int('Whole cents').min(0).max(10_000_000).optional(),
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
  timeZone: string;
  currency: string;
  depositMode: DepositMode;
  depositPercent: number;
  depositFixedCents: number;
}
