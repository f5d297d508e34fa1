/**
 * What every answer carries: a request id, compression for text when the client accepts it
 * (RFC 9110 §8.4 Content-Encoding, gzip per RFC 1952), and no source maps served from the client build.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';

let t: TestApp;
let s: TestShop;
let clientDir: string;

beforeAll(async () => {
  clientDir = fs.mkdtempSync(path.join(os.tmpdir(), 'pb-client-'));
  fs.mkdirSync(path.join(clientDir, 'assets'));
  fs.writeFileSync(path.join(clientDir, 'index.html'), '<!doctype html><title>Pullbook</title>');
  fs.writeFileSync(path.join(clientDir, 'assets', 'app.js'), `console.log(${JSON.stringify('x'.repeat(5000))});`);
  fs.writeFileSync(path.join(clientDir, 'assets', 'app.js.map'), '{"version":3,"sources":["src/secret.ts"]}');
  t = await createTestApp({ clientDir });
  s = await t.createShop('Http Basics');
});
afterAll(async () => {
  await t?.close();
  fs.rmSync(clientDir, { recursive: true, force: true });
});

describe('every answer', () => {
  it('carries a request id, reusing a sane one from the caller', async () => {
    const res = await t.request.get('/api/health').set('X-Request-Id', 'lb-trace-7');
    expect(res.headers['x-request-id']).toBe('lb-trace-7');
    const made = await t.request.get('/api/health');
    expect(made.headers['x-request-id']).toMatch(/^[0-9a-f]{8}$/);
  });

  it('compresses text for a client that accepts gzip, and the body inflates to the whole JSON page', async () => {
    const owner = await t.signIn(s.users.owner);
    for (let i = 0; i < 30; i++) await owner.post('/api/customers').send({ name: `Compression Rider ${i} with a long enough name` });
    const res = await owner.get('/api/customers').query({ pageSize: 50 }).set('Accept-Encoding', 'gzip').buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('gzip');
    // supertest inflates the gzip body it received; it must still be the whole JSON page.
    const body = JSON.parse((res.body as Buffer).toString('utf8'));
    expect(body.items.length).toBeGreaterThanOrEqual(30);
  });

  it('serves the client build but never its source maps', async () => {
    expect((await t.request.get('/assets/app.js')).status).toBe(200);
    const map = await t.request.get('/assets/app.js.map');
    expect(map.status).toBe(404);
    expect(map.text).not.toContain('secret.ts');
  });
});
