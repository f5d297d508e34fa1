/**
 * `npm run bench` — runs every bench module in turn. Each module exports
 * `async function run(): Promise<void>` and prints its own table. To add a bench, add a line to
 * BENCHES.
 */
export {};

// The SDK's notice about Node 20 support is noise in a bench table.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';

const BENCHES: { name: string; load: () => Promise<{ run: () => Promise<void> }> }[] = [
  { name: 'run-file analysis (analyze)', load: () => import('./analyze.bench.js') },
  { name: 'build finder', load: () => import('./finder.bench.js') },
  { name: 'gain-report PDF', load: () => import('./report.bench.js') },
  { name: 'run upload', load: () => import('./upload.bench.js') },
  { name: 'comparison preview', load: () => import('./comparison.bench.js') },
  { name: 'archive scale (everyday pages)', load: () => import('./scale.bench.js') },
  { name: 'bay capture (file saved → pull shown)', load: () => import('./bay.bench.js') },
];

const only = process.argv.slice(2);
let failed = false;
for (const bench of BENCHES) {
  if (only.length > 0 && !only.some((o) => bench.name.includes(o))) continue;
  process.stdout.write(`\n== ${bench.name} ==\n`);
  try {
    await (await bench.load()).run();
  } catch (e) {
    failed = true;
    process.stdout.write(`bench failed: ${e instanceof Error ? e.message : String(e)}\n`);
  }
}
process.exitCode = failed ? 1 : 0;
