import type { PasswordJudgement } from '@shared/password-policy';

/** The meter's bar count: one segment per zxcvbn score step above 0 (its scale is 0–4). */
export const METER_SEGMENTS = 4;

/** zxcvbn's scores in plain words (the scale's meaning is zxcvbn's; the wording is ours). */
export const SCORE_WORDS: Record<PasswordJudgement['score'], string> = {
  0: 'Very weak',
  1: 'Weak',
  2: 'Fair',
  3: 'Strong',
  4: 'Very strong',
};

export type MeterTone = 'loss' | 'warn' | 'gain';

export interface MeterView {
  /** "Strength: Fair" and the like. */
  label: string;
  /** Filled bar segments, 0…METER_SEGMENTS. */
  filled: number;
  tone: MeterTone;
  /** The policy's reason for refusing it, else its hint, else nothing. */
  message: string | null;
  ok: boolean;
}

/**
 * What the strength meter shows for the policy's judgement of a typed password: nothing for an
 * empty field. A password the policy refuses is never shown in the "good" colour, whatever its score.
 */
export function meterView(password: string, judgement: PasswordJudgement | null): MeterView | null {
  if (!password || !judgement) return null;
  const { score, ok, problem, hint } = judgement;
  const tone: MeterTone = ok ? 'gain' : score >= 2 ? 'warn' : 'loss';
  return { label: `Strength: ${SCORE_WORDS[score]}`, filled: score, tone, message: problem ?? hint, ok };
}
