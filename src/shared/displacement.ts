/** 1 in³ = 16.387 064 cm³ exactly (NIST SP 811, Appendix B: 1 in = 2.54 cm exactly). */
export const CC_PER_CUBIC_INCH = 16.387064;

export type DisplacementUnit = 'cc' | 'ci';

export const cubicInchesToCc = (ci: number) => ci * CC_PER_CUBIC_INCH;
export const ccToCubicInches = (cc: number) => cc / CC_PER_CUBIC_INCH;

/** Stored value is always cm³. */
export function toCc(value: number, unit: DisplacementUnit): number {
  return unit === 'ci' ? cubicInchesToCc(value) : value;
}
