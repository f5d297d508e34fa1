import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { ROOT } from './paths';

function newestMtime(p: string): number {
  const st = fs.statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = st.mtimeMs;
  for (const name of fs.readdirSync(p)) newest = Math.max(newest, newestMtime(path.join(p, name)));
  return newest;
}

/** Build the client with Vite when dist/ is missing or older than its sources. */
export function ensureClientBuilt(force = false) {
  const indexHtml = path.join(ROOT, 'dist', 'index.html');
  const sources = ['src', 'index.html', 'vite.config.ts', 'tailwind.config.ts'].map((p) => path.join(ROOT, p)).filter((p) => fs.existsSync(p));
  const stale = force || !fs.existsSync(indexHtml) || Math.max(...sources.map(newestMtime)) > fs.statSync(indexHtml).mtimeMs;
  if (!stale) return;
  console.log('[build] building the client (vite build)…');
  execFileSync(process.execPath, [path.join(ROOT, 'node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn'], { cwd: ROOT, stdio: 'inherit' });
}

/** Build the client into outDir (used by the test run, which must not touch dist/). */
export function buildClient(outDir: string) {
  console.log(`[build] building the client into ${path.relative(ROOT, outDir)}…`);
  execFileSync(process.execPath, [path.join(ROOT, 'node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn', '--outDir', outDir, '--emptyOutDir'], { cwd: ROOT, stdio: 'inherit' });
}
