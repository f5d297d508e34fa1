import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';
import type { Plugin } from 'vite';
import { checkBudget, type BudgetChunk } from './bench/lib/bundle-budget.js';

const r = (p: string) => fileURLToPath(new URL(p, import.meta.url));

/**
 * Fails the build when the client outgrows its budget (bench/lib/bundle-budget.ts): first load
 * at most 146 kB gzip, no chunk above 220 kB gzip.
 */
function bundleBudget(): Plugin {
  return {
    name: 'pullbook-bundle-budget',
    apply: 'build',
    generateBundle(_options, bundle) {
      const chunks: BudgetChunk[] = [];
      for (const out of Object.values(bundle)) if (out.type === 'chunk') chunks.push({ fileName: out.fileName, isEntry: out.isEntry, imports: out.imports, code: out.code });
      const report = checkBudget(chunks);
      this.info(`first load ${(report.firstLoad.gzipBytes / 1000).toFixed(1)} kB gzip; largest chunk ${report.largest.fileName} ${(report.largest.gzipBytes / 1000).toFixed(1)} kB gzip`);
      if (report.problems.length) this.error(`bundle budget: ${report.problems.join('; ')}`);
    },
  };
}

// The API is served by the same Express process (scripts/start.ts mounts Vite as middleware in
// dev), so no proxy table is needed; `server.proxy` below covers running `vite` on its own.
export default defineConfig({
  plugins: [react(), tailwindcss(), bundleBudget()],
  resolve: { alias: { '@': r('./src'), '@server': r('./server'), '@shared': r('./src/shared') } },
  server: {
    proxy: { '/api': `http://127.0.0.1:${process.env.PORT ?? 3000}`, '/share': `http://127.0.0.1:${process.env.PORT ?? 3000}` },
  },
  // Source maps are built for error reports but never referenced from the bundles, and the server
  // does not serve .map files (see server/app.ts).
  // chunkSizeWarningLimit stays Vite's default; the budget above is what the build enforces.
  build: {
    outDir: 'dist',
    sourcemap: 'hidden',
    rolldownOptions: {
      output: {
        // The common-password list (about 190 kB gzip) in a chunk of its own, so the lazily
        // loaded password policy is two chunks under the per-chunk budget instead of one over it.
        codeSplitting: { groups: [{ name: 'password-list', test: /@zxcvbn-ts[\\/]language-common[\\/]dist[\\/]passwords/ }] },
      },
    },
  },
});
