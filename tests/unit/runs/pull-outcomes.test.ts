import { describe, expect, it } from 'vitest';
import { outcomeFields } from '@server/modules/runs/run-outcome';
import { pullOutcome } from '@server/modules/runs/run-analysis';
import { fileResult } from '@server/modules/runs/upload-runs';
import type { RunSummaryDto } from '@shared/schemas/run';
import { failedOutcome, readyOutcome } from './outcome-fixtures';

/** Hand-made outcomes and summaries (invented figures): the code under test only picks and copies them. */
const pullOf = (index: number, count: number, timeRange: [number, number] | null) => {
  const o = readyOutcome({ pull: { index, count, main: index === 0, partial: false, sampleRange: [index * 100, index * 100 + 80], lineRange: [index * 100 + 3, index * 100 + 83], timeRange } });
  return { ...o, pullIndex: index, pullCount: count };
};

const summary = (over: Partial<RunSummaryDto>): RunSummaryDto => ({
  id: 'r', bikeId: 'b', bikeLabel: 'x', customerName: 'y', sessionId: null, stageId: null, stageName: null, label: null, sequence: 1, originalName: 'log.csv',
  status: 'ready', peakPowerHp: 90, peakPowerRpm: 5500, peakTorqueLbft: 95, peakTorqueRpm: 3400, rpmMin: 2000, rpmMax: 5800, identityStatus: 'ok',
  correctionStandard: 'none', correctionFactor: 1, warnings: [], error: null, tags: [], note: null, isReference: false, pullIndex: 0, pullCount: 1, review: false,
  createdAt: '2026-01-01T00:00:00.000Z', deletedAt: null, ...over,
});

describe('pull fields of an outcome', () => {
  it('copies the pull count and where the pull lies in the log; a failed reading keeps no range', () => {
    const f = outcomeFields(pullOf(2, 3, [41.5, 49.25]));
    expect(f).toMatchObject({ pullCount: 3, pullStartS: 41.5, pullEndS: 49.25, pullFirstRow: 200, pullLastRow: 280, rpmPerSpeed: null });
    expect(outcomeFields(pullOf(1, 3, null))).toMatchObject({ pullStartS: null, pullEndS: null, pullFirstRow: 100 });
    expect(outcomeFields(failedOutcome())).toMatchObject({ pullCount: 1, pullStartS: null, pullFirstRow: null });
  });

  it("picks a run's own pull; a pull the file no longer holds is a failed reading (PULL_NOT_FOUND)", () => {
    const all = [pullOf(0, 3, null), pullOf(1, 3, null), pullOf(2, 3, null)];
    expect(pullOutcome(all, 1)).toBe(all[1]);
    const gone = pullOutcome(all.slice(0, 2), 2);
    expect([gone.status, gone.error?.code, gone.pullIndex, gone.result]).toEqual(['failed', 'PULL_NOT_FOUND', 2, null]);
    // A file that cannot be read at all answers its own error for every pull.
    const unread = pullOutcome([failedOutcome('NEEDS_MAPPING')], 2);
    expect([unread.status, unread.error?.code, unread.pullIndex]).toEqual(['needs-mapping', 'NEEDS_MAPPING', 2]);
  });
});

describe('upload result of a file', () => {
  it('tells how many pulls were found and lists every run; the first readable run answers for the file', () => {
    const runs = [summary({ id: 'a', status: 'failed', pullIndex: 0, pullCount: 3 }), summary({ id: 'b', pullIndex: 1, pullCount: 3 }), summary({ id: 'c', pullIndex: 2, pullCount: 3 })];
    const r = fileResult('log.csv', runs, false);
    expect(r).toMatchObject({ ok: true, pullCount: 3, run: { id: 'b' } });
    expect(r.runs!.map((x) => x.id)).toEqual(['a', 'b', 'c']);
    const dup = fileResult('log.csv', runs, true);
    expect(dup).toMatchObject({ ok: true, duplicate: true, message: 'Already in the archive: 3 runs from log.csv; nothing new was saved.' });
  });

  it('a one-pull file answers as before (no run list), and an unreadable one with its error', () => {
    expect(fileResult('one.csv', [summary({ id: 'a' })], false)).toEqual({ file: 'one.csv', ok: true, run: summary({ id: 'a' }), pullCount: 1 });
    const failed = fileResult('bad.csv', [summary({ id: 'z', status: 'needs-mapping', error: { code: 'NO_RPM_COLUMN', message: 'no rpm' } })], false);
    expect(failed).toEqual({ file: 'bad.csv', ok: false, error: { code: 'NO_RPM_COLUMN', message: 'no rpm' }, runId: 'z', pullCount: 1 });
    // The reader's own error, with its mapping help, when the pipeline has it.
    const help = { code: 'NO_RPM_COLUMN', message: 'no rpm', details: { headers: ['Time', 'Road Speed'], speedColumn: 'Road Speed' } };
    expect(fileResult('bad.csv', [summary({ id: 'z', status: 'needs-mapping' })], false, help)).toMatchObject({ ok: false, error: help, runId: 'z' });
  });
});
