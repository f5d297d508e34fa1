import { describe, expect, it } from 'vitest';
import { nextStageName, runFileLabel, runName, runNameWithFile } from '@shared/labels';

// The run name scheme is the product's own (common practice, no published source): the stage,
// the pull's number in its session, and the uploaded file as secondary text.
describe('runName', () => {
  it('reads "<stage> · pull <n>" from the stage as an object (engine rows) or as a name (DTOs)', () => {
    expect(runName({ label: null, sequence: 4, stage: { name: 'Stage 1' } })).toBe('Stage 1 · pull 4');
    expect(runName({ label: null, sequence: 2, stageName: 'Baseline' })).toBe('Baseline · pull 2');
  });

  it('files a run without a stage under "No stage"', () => {
    expect(runName({ label: null, sequence: 3, stage: null })).toBe('No stage · pull 3');
    expect(runName({ sequence: 1, stageName: null })).toBe('No stage · pull 1');
  });

  it('uses a label a person gave, trimmed; a blank label does not count', () => {
    expect(runName({ label: '  Hot pull after tune ', sequence: 5, stageName: 'Stage 1' })).toBe('Hot pull after tune');
    expect(runName({ label: '   ', sequence: 5, stageName: 'Stage 1' })).toBe('Stage 1 · pull 5');
  });
});

describe('runFileLabel', () => {
  it('is the file name for a file holding one pull', () => {
    expect(runFileLabel({ originalName: 'pull-04.csv' })).toBe('pull-04.csv');
    expect(runFileLabel({ originalName: 'pull-04.csv', pullIndex: 0, pullCount: 1 })).toBe('pull-04.csv');
  });

  it('names the pull of a log holding several (1-based, of the count)', () => {
    expect(runFileLabel({ originalName: 'session.log', pullIndex: 1, pullCount: 3 })).toBe('session.log · pull 2 of 3');
  });

  it('joins name and file for plain text', () => {
    expect(runNameWithFile({ label: null, sequence: 2, stageName: 'Stage 1', originalName: 'b.csv' })).toBe('Stage 1 · pull 2 (b.csv)');
  });
});

describe('nextStageName', () => {
  it('suggests Baseline first, then the stage after the highest numbered one', () => {
    expect(nextStageName([])).toBe('Baseline');
    expect(nextStageName(['Baseline'])).toBe('Stage 1');
    expect(nextStageName(['Baseline', 'Stage 1 — exhaust + tune'])).toBe('Stage 2');
    expect(nextStageName(['Stock', 'stage 3', 'Cam + ported heads'])).toBe('Stage 4');
  });

  it('never suggests a name already taken', () => {
    expect(nextStageName(['Baseline', 'Stage 1', 'Stage one'])).toBe('Stage 2');
    expect(nextStageName(['Stock'])).toBe('Stage 1');
  });
});
