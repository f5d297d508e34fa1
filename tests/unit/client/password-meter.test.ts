import { describe, expect, it } from 'vitest';
import { judgePassword } from '@shared/password-policy';
import { METER_SEGMENTS, meterView, SCORE_WORDS } from '@/features/auth/components/password-meter-model';

// The 0–4 scale is zxcvbn's (Wheeler 2016, USENIX Security: 0 too guessable … 4 very unguessable);
// the words and colours are the product's own, no published source.
describe('meterView', () => {
  it('shows nothing for an empty field or before the policy has loaded', () => {
    expect(meterView('', judgePassword(''))).toBeNull();
    expect(meterView('something', null)).toBeNull();
  });

  it('shows a common password as very weak, in the loss colour, with the policy’s reason', () => {
    // "qwertyuiop" is on the common-password list of @zxcvbn-ts/language-common (NIST SP 800-63B §5.1.1.2).
    const view = meterView('qwertyuiop', judgePassword('qwertyuiop'));
    expect(view).toMatchObject({ label: 'Strength: Very weak', filled: 0, tone: 'loss', ok: false });
    expect(view?.message).toMatch(/commonly used/);
  });

  it('fills every segment for a long passphrase the policy accepts', () => {
    // A passphrase of random words in the spirit of NIST SP 800-63B's advice on long passphrases; zxcvbn scores it 4.
    const view = meterView('correct-horse-battery', judgePassword('correct-horse-battery'));
    expect(view).toEqual({ label: 'Strength: Very strong', filled: METER_SEGMENTS, tone: 'gain', message: null, ok: true });
  });

  it('never shows a refused password in the good colour, whatever its score', () => {
    const refused = { score: 4 as const, ok: false, problem: 'It is built from your name or e-mail address. Choose something else.', hint: null };
    expect(meterView('jane.doe.rides.2026', refused)).toMatchObject({ tone: 'warn', filled: 4, message: refused.problem });
    const weakRefused = { score: 1 as const, ok: false, problem: 'Too easy to guess.', hint: 'A single word is easy to guess.' };
    expect(meterView('motorcycle', weakRefused)).toMatchObject({ tone: 'loss', filled: 1, label: `Strength: ${SCORE_WORDS[1]}`, message: 'Too easy to guess.' });
  });

  it('has a word for each of zxcvbn’s five scores', () => {
    expect(Object.keys(SCORE_WORDS).map(Number)).toEqual([0, 1, 2, 3, 4]);
    expect(new Set(Object.values(SCORE_WORDS)).size).toBe(5);
  });
});
