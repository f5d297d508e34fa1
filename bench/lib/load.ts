import { Worker } from 'node:worker_threads';
import type autocannon from 'autocannon';
import { percentile } from './stats.js';

export interface LoadResult {
  requests: number;
  /** Responses other than 200. */
  errors: number;
  medianMs: number;
  p95Ms: number;
  /** Every response's time in ms, ascending. */
  times: number[];
}

/**
 * Runs autocannon in a worker thread (so it does not steal the app's event loop) and takes
 * median and p95 from every response's time, not autocannon's histogram. `paths` rotates the
 * request path over the given list.
 */
export async function loadTest(options: Omit<autocannon.Options, 'requests' | 'setupClient'>, paths?: string[]): Promise<LoadResult> {
  const { times, errors } = await new Promise<{ times: number[]; errors: number }>((resolve, reject) => {
    const worker = new Worker(new URL('./load-worker.mjs', import.meta.url), { workerData: { options, paths } });
    worker.once('message', (msg: { times: number[]; errors: number } | { error: string }) => {
      void worker.terminate();
      if ('error' in msg) reject(new Error(msg.error));
      else resolve(msg);
    });
    worker.once('error', reject);
  });
  times.sort((a, b) => a - b);
  return { requests: times.length, errors, medianMs: percentile(times, 0.5), p95Ms: percentile(times, 0.95), times };
}
