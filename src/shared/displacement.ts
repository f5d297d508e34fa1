/** 1 in³ = 16.387 064 cm³ exactly (NIST SP 811, Appendix B: 1 in = 2.54 cm exactly). */
export const CC_PER_CUBIC_INCH = 16.387064;

export type DisplacementUnit = 'cc' | 'ci';

export const cubicInchesToCc = (ci: number) => ci * CC_PER_CUBIC_INCH;
export const ccToCubicInches = (cc: number) => cc / CC_PER_CUBIC_INCH;

/** Stored value is always cm³. */
export function toCc(value: number, unit: DisplacementUnit): number {
  return unit === 'ci' ? cubicInchesToCc(value) : value;
}

/**
 * Above this a "cubic inch" figure is really cm³: 300 in³ is about 4,900 cm³, larger than any
 * production motorcycle engine (common practice, no published source), while the usual cm³ sizes
 * (600, 1000, 1746 …) all lie above it.
 */
export const MAX_PLAUSIBLE_CUBIC_INCHES = 300;

/**
 * The unit a typed size is most likely in: a number above 300 entered as cubic inches is taken as
 * cm³ (1746 → 1,746 cm³ = 106.5 in³); anything else keeps the chosen unit.
 */
export function guessDisplacementUnit(value: number, chosen: DisplacementUnit): DisplacementUnit {
  return chosen === 'ci' && Number.isFinite(value) && value > MAX_PLAUSIBLE_CUBIC_INCHES ? 'cc' : chosen;
}
