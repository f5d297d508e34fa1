import { describe, expect, it } from 'vitest';
import { audienceOf } from '@/lib/auth';

describe('who a page is for, in words (RequireRole)', () => {
  it('names the audience of each guard used by the routes', () => {
    expect(audienceOf(['owner', 'tuner', 'desk'])).toBe('shop staff');
    expect(audienceOf(['owner'])).toBe('the shop owner');
    expect(audienceOf(['owner', 'tuner'])).toBe('owners and tuners');
    expect(audienceOf(['owner', 'tuner', 'customer'])).toBe('owners, tuners and customers');
  });
});
