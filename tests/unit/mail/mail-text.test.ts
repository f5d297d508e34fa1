import { describe, expect, it } from 'vitest';
import { clip, describeMailError, fitSubject, isPermanentMailError, SUBJECT_MAX } from '@server/lib/mail/mail-text';

describe('fitSubject', () => {
  it('keeps a short subject as it is', () => {
    expect(fitSubject('Reset your Pullbook password')).toBe('Reset your Pullbook password');
  });

  it('cuts a subject built from a 100-character make and model to SUBJECT_MAX, ending in an ellipsis', () => {
    const make = 'M'.repeat(100);
    const model = 'Model '.repeat(17).trim();
    const s = fitSubject(`Gain report R-0001 for your 2021 ${make} ${model} — Test Shop`);
    expect(s.length).toBeLessThanOrEqual(SUBJECT_MAX);
    expect(s.startsWith('Gain report R-0001 for your 2021 MMM')).toBe(true);
    expect(s.endsWith('…')).toBe(true);
  });

  it('never lets a line break start another header', () => {
    expect(fitSubject('Hello\r\nBcc: x@y.test')).toBe('Hello Bcc: x@y.test');
  });
});

describe('clip', () => {
  it('cuts at a word boundary when one is near the end', () => {
    expect(clip('alpha beta gamma delta', 15)).toBe('alpha beta…');
  });
  it('cuts a long unbroken word mid-word', () => {
    expect(clip('x'.repeat(40), 10)).toBe(`${'x'.repeat(9)}…`);
  });
});

describe('isPermanentMailError', () => {
  // RFC 5321 §4.2.1: 4yz replies are transient, 5yz permanent.
  it('reads the relay’s reply code', () => {
    expect(isPermanentMailError({ responseCode: 550, message: 'mailbox unavailable' })).toBe(true);
    expect(isPermanentMailError({ responseCode: 451, message: 'try later' })).toBe(false);
  });
  it('treats an unreachable relay as transient', () => {
    expect(isPermanentMailError(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:2525'), { code: 'ESOCKET' }))).toBe(false);
  });
  it('reads a reply code at the start of a bare message', () => {
    expect(isPermanentMailError(new Error('550 mailbox unavailable'))).toBe(true);
    expect(isPermanentMailError(new Error('421 service not available'))).toBe(false);
  });
});

describe('describeMailError', () => {
  it('never names the relay’s address, host, port or URL', () => {
    const refused = Object.assign(new Error('connect ECONNREFUSED 10.1.2.3:2525'), { code: 'ESOCKET' });
    const a = describeMailError(refused, ['mail.internal.example']);
    expect(a).not.toMatch(/10\.1\.2\.3|2525/);
    expect(a).toMatch(/tried again/);
    const b = describeMailError({ responseCode: 554, response: '554 mail.internal.example [10.1.2.3]: relay access denied via smtp://u:p@mail.internal.example:587' }, ['mail.internal.example']);
    expect(b).not.toMatch(/10\.1\.2\.3|internal|587|u:p/);
    expect(b).toContain('relay access denied');
    expect(describeMailError({ message: 'connect to [2001:db8::1]:25 failed' })).not.toContain('2001');
  });
  it('keeps the relay’s words and the recipient’s address', () => {
    expect(describeMailError(new Error('550 mailbox unavailable'))).toBe('550 mailbox unavailable');
    expect(describeMailError({ responseCode: 550, response: '550 5.1.1 <nobody@nowhere.test>: unknown user' })).toBe('550 5.1.1 <nobody@nowhere.test>: unknown user');
  });
});
