import { createHash } from 'node:crypto';
import type supertest from 'supertest';
import { syntheticRunFile } from '@server/db/synthetic-runs';

/** Helpers of the run API tests: invented run files, uploads and binary downloads. */
export type Agent = ReturnType<typeof supertest.agent>;

export const sha256Hex = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

/** A run file of the invented engine model (server/db/synthetic-runs.ts) with the given seed. */
export const runFile = (seed: number, opts: Parameters<typeof syntheticRunFile>[0] = {}, fmt: Parameters<typeof syntheticRunFile>[1] = {}) => Buffer.from(syntheticRunFile({ seed, ...opts }, fmt).bytes);

/** POST /api/runs with the files as CSV parts and any extra form fields. */
export function uploadRuns(agent: Agent, bikeId: string, files: { name: string; bytes: Buffer }[], extra: Record<string, string> = {}) {
  let req = agent.post('/api/runs').field('bikeId', bikeId);
  for (const [k, v] of Object.entries(extra)) req = req.field(k, v);
  for (const f of files) req = req.attach('files', f.bytes, { filename: f.name, contentType: 'text/csv' });
  return req;
}

/** Binary download as a Buffer (supertest parses only text by default). */
export function download(agent: Agent, url: string) {
  return agent
    .get(url)
    .buffer(true)
    .parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
}
