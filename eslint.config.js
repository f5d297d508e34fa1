import js from '@eslint/js';
import globals from 'globals';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import reactRefresh from 'eslint-plugin-react-refresh';

export default tseslint.config(
  { ignores: ['dist', 'node_modules', 'storage', 'tests/artifacts', 'coverage'] },
  {
    extends: [js.configs.recommended, ...tseslint.configs.recommended],
    files: ['**/*.{ts,tsx}'],
    languageOptions: { ecmaVersion: 2022, globals: { ...globals.browser, ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' }],
      '@typescript-eslint/no-explicit-any': 'error',
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks, 'react-refresh': reactRefresh },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
      'react-refresh/only-export-components': 'off',
    },
  },
  // Import zones: src/shared is the isomorphic core and imports neither side; the client never
  // imports the server; the server may import src/shared but nothing else of the client.
  {
    files: ['src/shared/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [
        { group: ['@/*', '@server/*', '**/server/**', '**/features/**', '**/app/**', '**/lib/**', '**/components/**', '**/config/**'], message: 'src/shared imports neither the server nor the client (src/features, src/app, src/lib, src/components).' },
        { group: ['react', 'react-dom', 'react-dom/*', 'echarts', 'echarts/*', 'node:*', 'express', '@mikro-orm/*'], message: 'src/shared is plain TypeScript that runs in the browser and in Node.' },
      ] }],
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    ignores: ['src/shared/**', 'src/features/**'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['@server/*', '**/server/**'], message: 'The client never imports server code; share it through src/shared.' }] }],
    },
  },
  {
    files: ['server/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['@/*', '**/src/features/**', '**/src/app/**', '**/src/lib/**', '**/src/components/**', '**/src/config/**'], message: 'The server imports only src/shared (alias @shared) of the client tree.' }] }],
    },
  },
  {
    // Server code logs through server/lib/logger.ts (pino: JSON lines, secrets redacted). The
    // command-line tools in server/cli print their results for a person at a terminal.
    files: ['server/**/*.{ts,tsx}'],
    ignores: ['server/cli/**'],
    rules: { 'no-console': 'error' },
  },
  {
    // Features use shared code, never each other's internals, and never the server.
    files: ['src/features/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [
        // A feature may group its own files one level deeper (runs/components/stages/…); '../../api',
        // '../../components', '../../lib' and '../../pages' from there stay inside the feature (no feature has those names).
        { group: ['../../*/**', '!../../api/**', '!../../components/**', '!../../lib/**', '!../../pages/**', '@/features/*/components/*', '@/features/*/api/*'], message: 'Import shared code from @/components, @/lib or @shared; features do not import each other.' },
        { group: ['@server/*', '**/server/**'], message: 'The client never imports server code; share it through src/shared.' },
      ] }],
    },
  },
);
