import { describe, expect, it } from 'vitest';
import { sinceText } from '@/features/dynos/lib/since';

/** "Agent last heard" wording on the bay board (time arithmetic only: 60 s a minute, 3,600 s an hour, 86,400 s a day). */
describe('sinceText', () => {
  const now = Date.parse('2026-12-02T12:00:00Z');
  const ago = (s: number) => new Date(now - s * 1000).toISOString();
  it('reads seconds, minutes, hours and days', () => {
    expect(sinceText(null, now)).toBe('never');
    expect(sinceText(ago(2), now)).toBe('just now');
    expect(sinceText(ago(42), now)).toBe('42 s ago');
    expect(sinceText(ago(5 * 60), now)).toBe('5 min ago');
    expect(sinceText(ago(3 * 3600), now)).toBe('3 h ago');
    expect(sinceText(ago(2 * 86_400), now)).toBe('2 days ago');
    expect(sinceText(ago(36 * 3600), now)).toBe('2 days ago');
  });
  it('never reads a clock slightly ahead as the future', () => {
    expect(sinceText(new Date(now + 3000).toISOString(), now)).toBe('just now');
  });
});
