import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';

const r = (p: string) => fileURLToPath(new URL(p, import.meta.url));

// The API is served by the same Express process (scripts/start.ts mounts Vite as middleware in
// dev), so no proxy table is needed; `server.proxy` below covers running `vite` on its own.
export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: { alias: { '@': r('./src'), '@server': r('./server'), '@shared': r('./src/shared') } },
  server: {
    proxy: { '/api': `http://127.0.0.1:${process.env.PORT ?? 3000}`, '/share': `http://127.0.0.1:${process.env.PORT ?? 3000}` },
  },
  // Source maps are built for error reports but never referenced from the bundles, and the server
  // does not serve .map files (see server/app.ts).
  build: { outDir: 'dist', sourcemap: 'hidden' },
});
