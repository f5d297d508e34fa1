import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync, createWriteStream } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { AnalysisError, analyzeBuffer, analyzeBufferPulls } from '@shared/analysis/index';
import { analyzeFile, analyzeFilePulls } from '@server/lib/run-files/index';
import { largeRunFileChunks, renderRunFile, syntheticLog, syntheticRunFile } from '@server/db/synthetic-runs';

const dir = mkdtempSync(join(tmpdir(), 'pullbook-analysis-'));

describe('analyzeFile (streaming)', () => {
  it('gives the same result as analyzeBuffer for every encoding', async () => {
    for (const encoding of ['utf-8', 'utf-8-bom', 'utf-16le', 'utf-16be', 'latin1'] as const) {
      const { bytes } = syntheticRunFile({ seed: 2 }, { encoding, preamble: 'colon', conditions: { temperatureC: 20, baroKpa: 100 } });
      const path = join(dir, `run-${encoding}.csv`);
      writeFileSync(path, bytes);
      const fromFile = await analyzeFile(path);
      expect(fromFile).toEqual(analyzeBuffer(bytes));
    }
  });

  it('reads a file larger than the sniffed head (several MB) in chunks', async () => {
    const path = join(dir, 'large.csv');
    const out = createWriteStream(path);
    for (const chunk of largeRunFileChunks(4 * 1024 * 1024, { seed: 3 })) out.write(chunk);
    await new Promise((r) => out.end(r));
    const r = await analyzeFile(path);
    expect(r.points).toBeGreaterThan(10_000);
    expect(r.identity.status).toBe('ok');
  });

  it('rejects with AnalysisError only (missing file, size limit)', async () => {
    await expect(analyzeFile(join(dir, 'nope.csv'))).rejects.toMatchObject({ code: 'READ_FAILED' });
    const path = join(dir, 'small.csv');
    writeFileSync(path, syntheticRunFile({ seed: 1 }).bytes);
    await expect(analyzeFile(path, { maxBytes: 100 })).rejects.toBeInstanceOf(AnalysisError);
    await expect(analyzeFile(dir)).rejects.toBeInstanceOf(AnalysisError);
  });

  it('gives every pull, as analyzeBufferPulls does, and stops at the end of the table', async () => {
    const log = syntheticLog({ seed: 5, pulls: [{ startRpm: 2000, endRpm: 5800 }, { startRpm: 2000, endRpm: 5600 }] });
    const bytes = renderRunFile(log, { footer: 'summary' }).bytes;
    const path = join(dir, 'two-pulls.csv');
    writeFileSync(path, bytes);
    const fromFile = await analyzeFilePulls(path);
    expect(fromFile).toEqual(analyzeBufferPulls(bytes));
    expect(fromFile.pulls).toHaveLength(2);
    expect(fromFile.pulls[0].warnings.map((w) => w.code)).toContain('TABLE_ENDED_EARLY');
  });
});
