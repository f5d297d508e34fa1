/**
 * How strong a new password must be, judged the same way on the server (which decides) and in the
 * browser (which shows the strength as you type):
 * - zxcvbn's guess estimate (`@zxcvbn-ts/core`) must reach score 3 ("safely unguessable": about
 *   10^8 guesses or more, Wheeler 2016, USENIX Security);
 * - it may not be on the list of commonly used or breached passwords (NIST SP 800-63B §5.1.1.2:
 *   verifiers compare new secrets against such a list) — the list shipped with
 *   `@zxcvbn-ts/language-common` — nor be built from the user's own name or e-mail;
 * - length between 10 and 200 characters (800-63B asks for at least 8 and allows at least 64).
 * The dictionaries are large (about 1 MB), so the client loads this module lazily.
 */
import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import { adjacencyGraphs, dictionary } from '@zxcvbn-ts/language-common';

export const PASSWORD_MIN_LENGTH = 10;
export const PASSWORD_MAX_LENGTH = 200;
export const PASSWORD_MIN_SCORE = 3;

let factory: ZxcvbnFactory | undefined;
let common: Set<string> | undefined;
function engine() {
  factory ??= new ZxcvbnFactory({ dictionary: { ...dictionary }, graphs: adjacencyGraphs });
  common ??= new Set((dictionary['passwords-common'] as string[]).map((p) => p.toLowerCase()));
  return { factory, common };
}

/** zxcvbn's feedback keys in our own plain words. */
const WARNINGS: Record<string, string> = {
  topTen: 'This is one of the most used passwords.',
  topHundred: 'This is a very commonly used password.',
  common: 'This is a commonly used password.',
  similarToCommon: 'This is close to a commonly used password.',
  wordByItself: 'A single word is easy to guess.',
  namesByThemselves: 'A name on its own is easy to guess.',
  commonNames: 'Common names are easy to guess.',
  userInputs: 'It contains your name or e-mail address.',
  straightRow: 'A straight row of keys is easy to guess.',
  keyPattern: 'A short keyboard pattern is easy to guess.',
  simpleRepeat: 'Repeated characters like "aaa" are easy to guess.',
  extendedRepeat: 'Repeated patterns like "abcabc" are easy to guess.',
  sequences: 'Sequences like "abc" or "6543" are easy to guess.',
  recentYears: 'Recent years are easy to guess.',
  dates: 'Dates are easy to guess.',
};

export interface PasswordJudgement {
  /** 0 (too guessable) … 4 (very unguessable), zxcvbn's scale. */
  score: 0 | 1 | 2 | 3 | 4;
  ok: boolean;
  /** Why it is refused, in plain words (null when ok). */
  problem: string | null;
  /** The most useful hint from zxcvbn, in our words, when there is one. */
  hint: string | null;
}

/**
 * zxcvbn matches user inputs only as whole tokens, so "jane.doe2026" still scores high. Take every
 * name or e-mail part out of the password: if what is left would be too easy to guess, the
 * password's strength came from the person's own details.
 */
function builtFromInputs(password: string, inputs: string[], factory: ZxcvbnFactory): boolean {
  let rest = password.toLowerCase();
  for (const token of [...new Set(inputs.map((s) => s.toLowerCase()))].sort((a, b) => b.length - a.length)) rest = rest.split(token).join('');
  return rest !== password.toLowerCase() && factory.check(rest).score < PASSWORD_MIN_SCORE;
}

/** Judges a new password; `userInputs` are the person's name and e-mail, which it must not be built from. */
export function judgePassword(password: string, userInputs: string[] = []): PasswordJudgement {
  const { factory, common } = engine();
  const inputs = userInputs.flatMap((s) => [s, ...s.toLowerCase().split(/[\s@._-]+/)]).filter((s) => s.length >= 3);
  const result = factory.check(password.slice(0, PASSWORD_MAX_LENGTH), inputs);
  const score = result.score as PasswordJudgement['score'];
  const hint = result.feedback.warning ? (WARNINGS[result.feedback.warning] ?? null) : null;
  let problem: string | null = null;
  if (password.length < PASSWORD_MIN_LENGTH) problem = `Use at least ${PASSWORD_MIN_LENGTH} characters.`;
  else if (password.length > PASSWORD_MAX_LENGTH) problem = `Use at most ${PASSWORD_MAX_LENGTH} characters.`;
  else if (common.has(password.toLowerCase())) problem = 'This password is on the list of commonly used passwords. Choose another.';
  else if (score < PASSWORD_MIN_SCORE) problem = hint ? `Too easy to guess: ${hint}` : 'Too easy to guess. Add more words or characters.';
  else if (builtFromInputs(password, inputs, factory)) problem = 'It is built from your name or e-mail address. Choose something else.';
  return { score, ok: problem === null, problem, hint };
}
