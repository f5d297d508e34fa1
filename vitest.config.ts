import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const r = (p: string) => fileURLToPath(new URL(p, import.meta.url));

/**
 * One config for every test. `npm test` (scripts/test.ts) starts PostgreSQL, the S3 fake and the
 * SMTP fake for the test run and passes their addresses in the environment; unit tests need none.
 */
export default defineConfig({
  resolve: { alias: { '@': r('./src'), '@server': r('./server'), '@shared': r('./src/shared') } },
  test: {
    include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'],
    environment: 'node',
    testTimeout: 30_000,
    hookTimeout: 60_000,
    pool: 'forks',
    execArgv: ['--import', 'tsx'],
  },
});
