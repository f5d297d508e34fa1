import type { AnalysisResult } from '@shared/analysis/index';
import type { AnalysisOutcome } from '@server/modules/runs/run-analysis';

/**
 * Hand-made analysis outcomes (invented figures, no engine run): the code under test only copies
 * and compares them, so their physical consistency does not matter here.
 */
export function readyOutcome(over: Partial<AnalysisResult> = {}): AnalysisOutcome {
  const result: AnalysisResult = {
    ok: true,
    columns: { rpm: 'Engine Speed', torque: 'Torque' },
    units: { torque: 'lbft', power: null },
    points: 412,
    droppedPoints: 9,
    rpmRange: [2500, 5800],
    peakPower: { hp: 98.7654, rpm: 5400 },
    peakTorque: { lbft: 112.345, rpm: 3600 },
    identity: { status: 'derived', maxDeviationPct: 0, medianDeviationPct: 0 },
    correction: { standard: 'sae-j1349', factor: 1.01234 },
    conditions: { temperatureC: 25, baroKpa: 99 },
    warnings: [{ code: 'HUMIDITY_ASSUMED_DRY', message: 'dry air assumed' }],
    curve: { rpm: [2500, 2550], torqueLbft: [100, 101], powerHp: [47.6, 49.04], afr: {} },
    headerSignature: 'engine speed|torque',
    confidence: 0.9,
    review: false,
    pull: { index: 0, count: 1, main: true, partial: false, sampleRange: [0, 420], lineRange: [3, 423], timeRange: [0, 8.4] },
    glitches: { dropped: 0, droppedInLog: 0, review: false, ranges: [], rangeCount: 0 },
    ...over,
  };
  return { status: 'ready', result, error: null, mapping: null, headerSignature: result.headerSignature, correction: 'sae-j1349', conditions: { temperatureC: 25, baroKpa: 99 }, pullIndex: result.pull.index, pullCount: result.pull.count, rpmPerSpeed: null };
}

export function failedOutcome(code: 'NO_SWEEP' | 'NEEDS_MAPPING' = 'NO_SWEEP'): AnalysisOutcome {
  return {
    status: code === 'NEEDS_MAPPING' ? 'needs-mapping' : 'failed',
    result: null,
    error: { code, message: 'no rising sweep', details: { line: 3 } },
    mapping: null,
    headerSignature: 'a|b',
    correction: 'iso-1585',
    conditions: { temperatureC: 20 },
    pullIndex: 0,
    pullCount: 1,
    rpmPerSpeed: null,
  };
}
