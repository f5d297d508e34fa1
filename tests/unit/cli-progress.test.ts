import { describe, expect, it } from 'vitest';
import { formatDuration, progressFigures, progressText, startProgress } from '@server/cli/progress';

// Hand-computed: 12 of 40 items in 4 s is 12 / 4 = 3 items/s; the 28 left take 28 / 3 = 9.33 s.
describe('progress figures', () => {
  it('rate and time left from what is done', () => {
    const f = progressFigures(12, 40, 4000);
    expect(f.rate).toBeCloseTo(3, 12);
    expect(f.etaSeconds).toBeCloseTo(28 / 3, 12);
    expect(progressFigures(0, 40, 4000)).toEqual({ rate: null, etaSeconds: null });
  });
  it('durations as m:ss or h:mm:ss (3,723 s = 1 h 2 min 3 s)', () => {
    expect(formatDuration(28 / 3)).toBe('0:09');
    expect(formatDuration(725)).toBe('12:05');
    expect(formatDuration(3723)).toBe('1:02:03');
    expect(formatDuration(null)).toBe('–');
  });
  it('one line of text: count, rate, time left', () => {
    expect(progressText(12, 40, 4000, 'runs')).toBe('12/40 runs · 3.0 runs/s · 0:09 left');
  });
});

describe('without a terminal', () => {
  it('prints numbered plain lines and the summary with the time taken', () => {
    let out = '';
    let t = 0;
    const stream = { isTTY: false, write: (s: string) => ((out += s), true) } as unknown as NodeJS.WriteStream;
    const p = startProgress({ total: 2, noun: 'files', stream, now: () => t });
    t = 1000;
    p.tick('a.csv: imported');
    t = 2000;
    p.tick('b.csv: already in the archive');
    t = 65_000;
    p.finish('2 of 2 file(s) in the archive.');
    expect(out).toBe('[1/2] a.csv: imported\n[2/2] b.csv: already in the archive\n2 of 2 file(s) in the archive. (1:05)\n');
  });
});
