/**
 * Password policy. Checked against the reference library itself (zxcvbn's score from
 * `@zxcvbn-ts/core`, Wheeler 2016) and the rules of NIST SP 800-63B §5.1.1.2: a password on the
 * common-password list is refused whatever its score, and so is one built from the user's name.
 */
import { describe, expect, it } from 'vitest';
import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import { adjacencyGraphs, dictionary } from '@zxcvbn-ts/language-common';
import { judgePassword, PASSWORD_MIN_SCORE } from '@shared/password-policy';

const reference = new ZxcvbnFactory({ dictionary: { ...dictionary }, graphs: adjacencyGraphs });

describe('judgePassword', () => {
  it('refuses the most common passwords (the list 800-63B asks verifiers to check)', () => {
    for (const p of ['password', '123456789012', 'qwertyuiop', 'iloveyou12']) {
      const j = judgePassword(p);
      expect(j.ok, p).toBe(false);
    }
    // "qwertyuiop" is itself on the common list: refused for that reason, not only for its score.
    expect(judgePassword('qwertyuiop').problem).toMatch(/commonly used|at least 10/);
  });

  it('accepts exactly what zxcvbn scores at 3 or more (and long enough, not on the list)', () => {
    for (const p of ['correct horse battery staple', 'grey gearbox at dawn 71', 'Mq8#vT2pLx!9']) {
      const expected = reference.check(p).score >= PASSWORD_MIN_SCORE;
      expect(judgePassword(p).ok, p).toBe(expected);
      expect(judgePassword(p).score).toBe(reference.check(p).score);
    }
    expect(judgePassword('correct horse battery staple').ok).toBe(true);
  });

  it('refuses a password built from the person’s own name or e-mail', () => {
    const mine = 'marguerite.okafor2026';
    expect(judgePassword(mine).ok).toBe(true);
    expect(judgePassword(mine, ['Marguerite Okafor', 'marguerite.okafor@example.test']).ok).toBe(false);
  });

  it('names the length rule before anything else', () => {
    expect(judgePassword('Xk#9q').problem).toBe('Use at least 10 characters.');
    expect(judgePassword('a'.repeat(201)).problem).toBe('Use at most 200 characters.');
  });
});
