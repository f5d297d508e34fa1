/**
 * Child process of the analysis bench: streams one file through analyzeFile and prints the time
 * and this process's peak RSS as JSON, so the memory figure is not polluted by the parent.
 */
import { analyzeFile } from '../server/lib/run-files/index.js';

const file = process.argv[2];
const t0 = performance.now();
const r = await analyzeFile(file);
const ms = performance.now() - t0;
// resourceUsage().maxRSS is in kilobytes.
const peakRssMb = process.resourceUsage().maxRSS / 1024;
process.stdout.write(JSON.stringify({ ms, peakRssMb, points: r.points, peakHp: r.peakPower.hp }));
