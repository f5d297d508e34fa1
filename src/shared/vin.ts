/**
 * Vehicle identification number check per 49 CFR Part 565 (US): 17 characters, no I, O or Q,
 * and position 9 is a check digit — the weighted sum of the transliterated characters mod 11,
 * where 10 is written "X".
 */
const TRANSLITERATION: Record<string, number> = {
  A: 1, B: 2, C: 3, D: 4, E: 5, F: 6, G: 7, H: 8,
  J: 1, K: 2, L: 3, M: 4, N: 5, P: 7, R: 9,
  S: 2, T: 3, U: 4, V: 5, W: 6, X: 7, Y: 8, Z: 9,
};
const WEIGHTS = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2];

export type VinProblem = 'length' | 'characters' | 'check-digit';

/** The check digit a VIN should carry, or null if it has characters a VIN never uses. */
export function vinCheckDigit(vin: string): string | null {
  let sum = 0;
  for (let i = 0; i < 17; i++) {
    const ch = vin[i];
    const value = /[0-9]/.test(ch) ? Number(ch) : TRANSLITERATION[ch];
    if (value === undefined) return null;
    sum += value * WEIGHTS[i];
  }
  const rest = sum % 11;
  return rest === 10 ? 'X' : String(rest);
}

/** Why a VIN is not valid, or null when it is. Input is upper-cased and trimmed first. */
export function vinProblem(raw: string): VinProblem | null {
  const vin = raw.trim().toUpperCase();
  if (vin.length !== 17) return 'length';
  if (!/^[A-HJ-NPR-Z0-9]{17}$/.test(vin)) return 'characters';
  return vinCheckDigit(vin) === vin[8] ? null : 'check-digit';
}

export const VIN_MESSAGES: Record<VinProblem, string> = {
  length: 'A VIN has exactly 17 characters',
  characters: 'A VIN uses only digits and capital letters other than I, O and Q',
  'check-digit': 'The check digit (9th character) does not match; please re-check the VIN',
};
