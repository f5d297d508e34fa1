import { describe, expect, it } from 'vitest';
import { fileResult } from '@server/modules/runs/upload-runs';
import type { RunSummaryDto } from '@shared/schemas/run';

/** A hand-made run summary (invented figures): the code under test only picks and words them. */
const summary = (over: Partial<RunSummaryDto>): RunSummaryDto => ({
  id: 'r', bikeId: 'b', bikeLabel: 'x', customerName: 'y', sessionId: null, stageId: null, stageName: null, label: null, sequence: 1, originalName: 'log.csv',
  status: 'ready', peakPowerHp: 90, peakPowerRpm: 5500, peakTorqueLbft: 95, peakTorqueRpm: 3400, rpmMin: 2000, rpmMax: 5800, identityStatus: 'ok',
  correctionStandard: 'none', correctionFactor: 1, warnings: [], error: null, tags: [], note: null, isReference: false, pullIndex: 0, pullCount: 1, review: false,
  createdAt: '2026-01-01T00:00:00.000Z', deletedAt: null, ...over,
});

describe('a file uploaded again whose stored copy was never read', () => {
  it('says the stored copy could not be read and offers the mapping for a file that needs it', () => {
    const run = summary({ id: 'm', status: 'needs-mapping', peakPowerHp: null, error: { code: 'NO_RPM_COLUMN', message: 'No engine-speed column was recognised' } });
    const r = fileResult('drum.csv', [run], true);
    expect(r).toMatchObject({ ok: true, duplicate: true, run: { id: 'm', status: 'needs-mapping' } });
    expect(r.ok && r.message).toBe('Already in the archive: log.csv; nothing new was saved. The stored copy could not be read: No engine-speed column was recognised. Choose its columns to read it.');
  });

  it('names the reason for a failed one, and keeps the plain answer for a readable duplicate', () => {
    const failed = fileResult('bad.csv', [summary({ status: 'failed', error: { code: 'HEADER_ONLY', message: 'The file has a header but no data rows.' } })], true);
    expect(failed.ok && failed.message).toBe('Already in the archive: log.csv; nothing new was saved. The stored copy could not be read: The file has a header but no data rows. It stays in the archive and can be read again later.');
    const fine = fileResult('good.csv', [summary({})], true);
    expect(fine.ok && fine.message).toBe('Already in the archive: log.csv; nothing new was saved.');
  });
});
