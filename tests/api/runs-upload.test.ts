import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createTestApp, TEST_PASSWORD, type TestApp, type TestShop } from '../support/test-app';
import { download, runFile as file, sha256Hex as sha, uploadRuns as upload, type Agent } from '../support/run-fixtures';
import { largeRunFileChunks } from '@server/db/synthetic-runs';
import { Run } from '@server/modules/runs/run.entity';
import { rawKeyFor } from '@server/modules/runs/raw-store';

/**
 * The upload route's temporary files (multer disk storage in UPLOAD_TMP_DIR, one folder for this
 * test file): large files stream through to storage unchanged, and no temporary file outlives
 * its request, whether it succeeds, fails in the handler, fails validation, hits a limit, finds
 * storage down or is aborted by the client.
 */
const MAX_FILE = 16 * 1024 * 1024;
const root = fs.mkdtempSync(path.join(os.tmpdir(), 'pullbook-upload-test-'));
// Not created here: the upload middleware creates it on demand.
const tmpDir = path.join(root, 'uploads');

let t: TestApp;
let a: TestShop;
let tuner: Agent;

const tempFiles = () => (fs.existsSync(tmpDir) ? fs.readdirSync(tmpDir).sort() : []);
/**
 * Files of the temporary folder that were not there at `before` (each test compares with its own
 * starting point, so one test's leftovers do not fail the next). Response-close clean-up runs
 * just after the answer reaches the client: give it a moment.
 */
const expectNoNewTempFiles = (before: string[]) => vi.waitFor(() => expect(tempFiles().filter((f) => !before.includes(f))).toEqual([]), { timeout: 3000, interval: 20 });

/** Records what each storage put received and how many temporary files existed at that moment. */
function watchPuts(app: TestApp) {
  const seen: { key: string; stream: boolean; tempFiles: number }[] = [];
  const original = app.deps.storage.put.bind(app.deps.storage);
  app.deps.storage.put = async (key, body, opts) => {
    seen.push({ key, stream: body instanceof Readable, tempFiles: tempFiles().length });
    return original(key, body, opts);
  };
  return { seen, restore: () => (app.deps.storage.put = original) };
}

beforeAll(async () => {
  t = await createTestApp({ env: { UPLOAD_TMP_DIR: tmpDir, UPLOAD_MAX_FILE_BYTES: String(MAX_FILE) } });
  a = await t.createShop('Upload Temp');
  tuner = await t.signIn(a.users.tuner);
});
afterAll(async () => {
  await t.close();
  fs.rmSync(root, { recursive: true, force: true });
});

describe('large files through the streamed path', () => {
  it('round-trips a ~12 MB file byte for byte (above the 8 MB multipart threshold)', async () => {
    const big = Buffer.from(Array.from(largeRunFileChunks(12 * 1024 * 1024, { seed: 4242 })).join(''));
    // The object store's MULTIPART_THRESHOLD is 8 MB and lib-storage's part size 5 MB: this file
    // goes up in several parts.
    expect(big.length).toBeGreaterThan(10 * 1024 * 1024);
    const before = tempFiles();
    const puts = watchPuts(t);
    let res;
    try {
      res = await upload(tuner, a.bike.id, [{ name: 'long-pull.csv', bytes: big }]);
    } finally {
      puts.restore();
    }
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(201);
    const r = res.body.results[0];
    expect(r.ok, JSON.stringify(r.error)).toBe(true);
    // The raw object went up as a stream read from the temporary file.
    expect(puts.seen).toEqual([{ key: rawKeyFor(a.shop.id, a.bike.id, sha(big)), stream: true, tempFiles: before.length + 1 }]);
    const row = await t.deps.orm.em.fork().findOneOrFail(Run, { id: r.run.id });
    expect(row.rawSha256).toBe(sha(big));
    expect(Number(row.rawSizeBytes)).toBe(big.length);
    const raw = await download(tuner, `/api/runs/${r.run.id}/raw`);
    expect(raw.status).toBe(200);
    expect((raw.body as Buffer).length).toBe(big.length);
    expect(sha(raw.body as Buffer)).toBe(sha(big));
    expect(raw.headers['x-content-sha256']).toBe(sha(big));
    await expectNoNewTempFiles(before);
  }, 60_000);
});

describe('temporary upload files', () => {
  it('go through UPLOAD_TMP_DIR and are all gone after a successful upload', async () => {
    const before = tempFiles();
    const files = Array.from({ length: 4 }, (_, i) => ({ name: `tmp-${i}.csv`, bytes: file(3000 + i) }));
    const puts = watchPuts(t);
    let res;
    try {
      res = await upload(tuner, a.bike.id, files);
    } finally {
      puts.restore();
    }
    expect(res.status).toBe(201);
    expect(res.body.results.map((r: { file: string; ok: boolean }) => [r.file, r.ok])).toEqual(files.map((f) => [f.name, true]));
    // While storing, all four request files sat in the folder; each went up as a stream.
    expect(puts.seen.map((p) => [p.stream, p.tempFiles])).toEqual(files.map(() => [true, before.length + files.length]));
    // Removed before the answer was sent (the handler's finally), not only at response close.
    expect(tempFiles()).toEqual(before);
  });

  it('are removed when the handler fails (another shop’s bike) and when validation fails', async () => {
    const before = tempFiles();
    const other = await t.createShop('Upload Temp Other');
    const notMine = await upload(tuner, other.bike.id, [{ name: 'x.csv', bytes: file(3100) }]);
    expect(notMine.status).toBe(404);
    await expectNoNewTempFiles(before);
    const invalid = await upload(tuner, 'not-a-uuid', [{ name: 'y.csv', bytes: file(3101) }, { name: 'z.csv', bytes: file(3102) }]);
    expect(invalid.status).toBe(400);
    await expectNoNewTempFiles(before);
    expect(await t.deps.orm.em.fork().count(Run, { originalName: { $in: ['x.csv', 'y.csv', 'z.csv'] } })).toBe(0);
  });

  it('are removed when a file is over the size limit (413)', async () => {
    const before = tempFiles();
    const small = file(3200);
    const tooBig = Buffer.alloc(MAX_FILE + 1024, 0x31);
    const res = await upload(tuner, a.bike.id, [{ name: 'ok.csv', bytes: small }, { name: 'huge.csv', bytes: tooBig }]);
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/larger than the limit \(16 MB per file\)/);
    await expectNoNewTempFiles(before);
    expect(await t.deps.orm.em.fork().count(Run, { originalName: { $in: ['ok.csv', 'huge.csv'] } })).toBe(0);
  });

  it('are removed when object storage is down (503)', async () => {
    const down = await createTestApp({ env: { S3_ENDPOINT: 'http://127.0.0.1:1', UPLOAD_TMP_DIR: tmpDir } });
    try {
      const before = tempFiles();
      const shop = await down.createShop('Upload Temp Down');
      const agent = await down.signIn(shop.users.tuner);
      const res = await upload(agent, shop.bike.id, [{ name: 'a.csv', bytes: file(3300) }, { name: 'b.csv', bytes: file(3301) }]);
      expect(res.status).toBe(503);
      await expectNoNewTempFiles(before);
      expect(await down.deps.orm.em.fork().count(Run, {})).toBe(0);
    } finally {
      await down.close();
    }
  });

  it('are removed when the client aborts mid-upload', async () => {
    const before = tempFiles();
    const server = t.app.listen(0, '127.0.0.1');
    await new Promise<void>((resolve) => server.once('listening', () => resolve()));
    try {
      const { port } = server.address() as AddressInfo;
      const login = await t.request.post('/api/auth/login').send({ email: a.users.tuner.email, password: TEST_PASSWORD });
      const cookie = ([] as string[]).concat(login.headers['set-cookie'] ?? []).map((c) => c.split(';')[0]).join('; ');
      expect(cookie).not.toBe('');
      const boundary = 'pullbook-abort-boundary';
      const req = http.request({ host: '127.0.0.1', port, method: 'POST', path: '/api/runs', headers: { cookie, 'content-type': `multipart/form-data; boundary=${boundary}` } });
      const ended = new Promise<void>((resolve) => {
        req.on('error', () => resolve());
        req.on('close', () => resolve());
      });
      req.write(`--${boundary}\r\nContent-Disposition: form-data; name="bikeId"\r\n\r\n${a.bike.id}\r\n`);
      req.write(`--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="cut.csv"\r\nContent-Type: text/csv\r\n\r\n`);
      req.write(Buffer.alloc(512 * 1024, 0x32));
      // The partial file is on disk before the client goes away.
      await vi.waitFor(() => expect(tempFiles().length).toBe(before.length + 1), { timeout: 3000, interval: 10 });
      req.destroy();
      await ended;
      await expectNoNewTempFiles(before);
      expect(await t.deps.orm.em.fork().count(Run, { originalName: 'cut.csv' })).toBe(0);
    } finally {
      await new Promise<void>((resolve) => server.close(() => resolve()));
    }
  });
});
