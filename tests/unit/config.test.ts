import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '@server/config/env';

const base = { DATABASE_URL: 'postgres://u@127.0.0.1:5432/db', SMTP_URL: 'smtp://127.0.0.1:2525', SESSION_SECRET: 'x'.repeat(32) };

describe('configuration', () => {
  it('applies defaults for everything optional', () => {
    const c = loadConfig(base);
    expect(c.PORT).toBe(3000);
    expect(c.S3_BUCKET).toBe('pullbook');
    expect(c.BCRYPT_ROUNDS).toBeGreaterThanOrEqual(10);
  });

  it('lists every bad variable at once', () => {
    try {
      loadConfig({ SESSION_SECRET: 'short', PORT: 'eighty' });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ConfigError);
      const msg = (e as Error).message;
      for (const name of ['DATABASE_URL', 'SMTP_URL', 'SESSION_SECRET', 'PORT']) expect(msg).toContain(name);
    }
  });

  it('refuses a bcrypt cost below 10', () => {
    expect(() => loadConfig({ ...base, BCRYPT_ROUNDS: '8' })).toThrow(ConfigError);
  });
});
