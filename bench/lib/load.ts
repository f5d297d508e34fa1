import autocannon from 'autocannon';
import { percentile } from './stats.js';

export interface LoadResult {
  requests: number;
  /** Responses other than 200. */
  errors: number;
  medianMs: number;
  p95Ms: number;
}

/** Runs autocannon and takes median and p95 from every response's time, not autocannon's histogram. */
export async function loadTest(options: autocannon.Options): Promise<LoadResult> {
  const times: number[] = [];
  let errors = 0;
  await new Promise<void>((resolve, reject) => {
    const instance = autocannon(options, (err) => (err ? reject(err) : resolve()));
    instance.on('response', (_client: unknown, statusCode: number, _bytes: number, responseTime: number) => {
      if (statusCode !== 200) errors += 1;
      times.push(responseTime);
    });
  });
  times.sort((a, b) => a - b);
  return { requests: times.length, errors, medianMs: percentile(times, 0.5), p95Ms: percentile(times, 0.95) };
}
