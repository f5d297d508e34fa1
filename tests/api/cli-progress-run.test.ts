/**
 * `npm run import` and `npm run reprocess` as a shop would run them, against a database of their
 * own: piped output gets numbered lines and a summary; on a terminal (faked with script(1)) a
 * progress bar with count, rate and time left.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';

let t: TestApp;
let shop: TestShop;
let dir: string;
const FILES = ['baseline-comma-brackets.csv', 'stage1-semicolon-decimal-comma.csv', 'stage1-pipe-abbreviated-lambda.txt'];

beforeAll(async () => {
  t = await createTestApp();
  shop = await t.createShop('Progress Bar Shop');
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'pullbook-import-'));
  for (const f of FILES) fs.copyFileSync(path.resolve('sample-data', f), path.join(dir, f));
}, 120_000);
afterAll(async () => {
  fs.rmSync(dir, { recursive: true, force: true });
  await t.close();
});

function cli(script: string, args: string[], tty = false) {
  const env = { ...process.env, DATABASE_URL: t.deps.config.DATABASE_URL, LOG_LEVEL: 'error' };
  const command = [process.execPath, '--import', 'tsx', path.resolve('server/cli', script), ...args];
  const res = tty
    ? spawnSync('script', ['-qec', command.map((a) => `'${a.replace(/'/g, `'\\''`)}'`).join(' '), '/dev/null'], { env: { ...env, COLUMNS: '120' }, encoding: 'utf8', timeout: 120_000 })
    : spawnSync(command[0], command.slice(1), { env, encoding: 'utf8', timeout: 120_000 });
  return { code: res.status, out: `${res.stdout}${res.stderr}` };
}

describe('command-line progress', () => {
  it('import, piped: one numbered line per file, then the summary', () => {
    const r = cli('import.ts', ['--bike', shop.bike.id, '--stage', 'Baseline', dir]);
    expect(r.out).toContain(`[1/${FILES.length}] `);
    expect(r.out).toContain(`[${FILES.length}/${FILES.length}] `);
    expect(r.out).toMatch(new RegExp(`${FILES.length} of ${FILES.length} file\\(s\\) in the archive: \\d+ imported, \\d+ already there`));
    expect(r.code).toBe(0);
  }, 150_000);

  it('reprocess on a terminal: a bar with count, rate and time left, then the summary', () => {
    const r = cli('reprocess.ts', [], true);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/\d+\/\d+ runs · [\d.–]+ runs\/s · [\d:–]+ left/);
    expect(r.out).toMatch(/\d+ run\(s\): \d+ changed, \d+ unchanged, \d+ not re-processed\./);
  }, 150_000);
});
