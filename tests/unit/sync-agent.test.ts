/**
 * The dyno PC's sync agent against a small real HTTP server that speaks the device upload route
 * (express + multer, as the app does): files already in the folder and new ones are sent once
 * they stop growing, a restart sends nothing twice, a server that is away is caught up with, a
 * refused token stops the agent, and the dyno's folder is never changed.
 */
import { afterEach, describe, expect, it } from 'vitest';
import express from 'express';
import multer from 'multer';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createHash } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import type http from 'node:http';
import { SyncAgent, type AgentEvent } from '../../server/sync-agent/agent';
import { backoffDelayMs } from '../../server/sync-agent/backoff';
import { DEVICE_UPLOAD_PATH, type DeviceUploadResponse } from '@shared/schemas/device';
import { isRunFileName } from '@shared/run-files';

const TOKEN = 'device-token-for-tests';
const sha = (b: Buffer | string) => createHash('sha256').update(b).digest('hex');

interface Received {
  name: string;
  sha256: string;
  size: number;
}

/** A device upload endpoint that records what it got; `mode` switches it to failing answers. */
function fakeServer() {
  const received: Received[] = [];
  const state = { mode: 'ok' as 'ok' | 'down-503' | 'refuse-token' };
  const app = express();
  app.post(DEVICE_UPLOAD_PATH, multer({ storage: multer.memoryStorage() }).array('files'), (req, res) => {
    if (req.headers.authorization !== `Bearer ${TOKEN}` || state.mode === 'refuse-token') {
      res.status(401).json({ error: { code: 'UNAUTHENTICATED', message: 'device token not recognised' } });
      return;
    }
    if (state.mode === 'down-503') {
      res.status(503).json({ error: { code: 'STORAGE_UNAVAILABLE', message: 'try later' } });
      return;
    }
    const files = req.files as Express.Multer.File[];
    for (const f of files) received.push({ name: f.originalname, sha256: sha(f.buffer), size: f.size });
    const body: DeviceUploadResponse = {
      landing: { kind: 'inbox', itemId: 'test-item', duplicate: false, pulls: 1 },
      results: files.map((f) => ({ file: f.originalname, ok: false as const, error: { code: 'NO_TABLE' as const, message: 'test server does not analyse' } })),
    };
    res.status(201).json(body);
  });
  let server: http.Server | undefined;
  return {
    received,
    state,
    async listen(port = 0): Promise<number> {
      server = await new Promise<http.Server>((resolve) => {
        const s = app.listen(port, '127.0.0.1', () => resolve(s));
      });
      return (server.address() as AddressInfo).port;
    },
    async close() {
      await new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve()));
      server?.closeAllConnections?.();
    },
  };
}

async function waitFor(cond: () => boolean, what: string, ms = 10_000) {
  const t0 = Date.now();
  while (!cond()) {
    if (Date.now() - t0 > ms) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** Every file in the folder with its size, mtime and hash: the agent must leave all of it as it was. */
function snapshot(dir: string) {
  return fs
    .readdirSync(dir)
    .sort()
    .map((n) => {
      const p = path.join(dir, n);
      const st = fs.statSync(p);
      return { n, size: st.size, mtime: st.mtimeMs, sha: sha(fs.readFileSync(p)) };
    });
}

const cleanups: (() => Promise<void> | void)[] = [];
afterEach(async () => {
  while (cleanups.length) await cleanups.pop()!();
});

function setup() {
  const root = fs.mkdtempSync(path.join(os.tmpdir(), 'pullbook-sync-'));
  const folder = path.join(root, 'dyno-pc-runs');
  fs.mkdirSync(folder);
  cleanups.push(() => fs.rmSync(root, { recursive: true, force: true }));
  return { folder, journalFile: path.join(root, 'agent', 'journal.json') };
}

function startAgent(server: string, folder: string, journalFile: string, token = TOKEN) {
  const agent = new SyncAgent({ server, token, folder, journalFile, settleMs: 200, firstBackoffMs: 50, maxBackoffMs: 200 });
  const events: AgentEvent[] = [];
  agent.on((e) => events.push(e));
  cleanups.push(() => agent.stop());
  return { agent, events };
}

describe('sync agent', () => {
  it('sends files already in the folder and new ones, each once, and a restart sends nothing again', async () => {
    const srv = fakeServer();
    const port = await srv.listen();
    cleanups.push(() => srv.close());
    const { folder, journalFile } = setup();
    fs.writeFileSync(path.join(folder, 'pull-01.csv'), 'rpm,torque\n2000,80\n');
    fs.writeFileSync(path.join(folder, 'notes.docx'), 'not a run file');
    const before = snapshot(folder);

    const first = startAgent(`http://127.0.0.1:${port}`, folder, journalFile);
    await first.agent.start();
    await waitFor(() => srv.received.length === 1, 'the file present at start-up');
    fs.writeFileSync(path.join(folder, 'pull-02.csv'), 'rpm,torque\n2000,81\n');
    await waitFor(() => srv.received.length === 2, 'the new file');
    await first.agent.stop();

    expect(srv.received.map((r) => r.name).sort()).toEqual(['pull-01.csv', 'pull-02.csv']);
    expect(srv.received.find((r) => r.name === 'pull-01.csv')!.sha256).toBe(sha('rpm,torque\n2000,80\n'));
    const journal = JSON.parse(fs.readFileSync(journalFile, 'utf8'));
    expect(Object.keys(journal.sent).sort()).toEqual(['pull-01.csv', 'pull-02.csv']);

    // Restart: both files are in the journal, so nothing is sent again.
    const second = startAgent(`http://127.0.0.1:${port}`, folder, journalFile);
    await second.agent.start();
    await waitFor(() => second.events.filter((e) => e.kind === 'skipped').length === 2, 'both files skipped');
    await new Promise((r) => setTimeout(r, 400));
    expect(srv.received).toHaveLength(2);
    // The agent never writes into the dyno's folder (only pull-02 was added, by the "dyno").
    const after = snapshot(folder).filter((f) => f.n !== 'pull-02.csv');
    expect(after).toEqual(before);
  });

  it('waits until a file has stopped growing and sends it whole, once', async () => {
    const srv = fakeServer();
    const port = await srv.listen();
    cleanups.push(() => srv.close());
    const { folder, journalFile } = setup();
    const { agent } = startAgent(`http://127.0.0.1:${port}`, folder, journalFile);
    await agent.start();
    const file = path.join(folder, 'growing.csv');
    let text = 'rpm,torque\n';
    fs.writeFileSync(file, text);
    for (let i = 0; i < 5; i++) {
      await new Promise((r) => setTimeout(r, 60)); // each write comes before the 200 ms settle time
      const line = `${2000 + i * 100},${80 + i}\n`;
      text += line;
      fs.appendFileSync(file, line);
    }
    await waitFor(() => srv.received.length >= 1, 'the finished file');
    await new Promise((r) => setTimeout(r, 500));
    expect(srv.received).toHaveLength(1);
    expect(srv.received[0].sha256).toBe(sha(text));
  });

  it('keeps trying while the server is away and catches up, in order, once it is back', async () => {
    const srv = fakeServer();
    const port = await srv.listen();
    await srv.close(); // the server is away; its port is known
    const { folder, journalFile } = setup();
    fs.writeFileSync(path.join(folder, 'a.csv'), 'rpm,torque\n2000,80\n');
    fs.writeFileSync(path.join(folder, 'b.csv'), 'rpm,torque\n2000,90\n');
    const { agent, events } = startAgent(`http://127.0.0.1:${port}`, folder, journalFile);
    await agent.start();
    await waitFor(() => events.filter((e) => e.kind === 'waiting').length >= 3, 'several retries');
    expect(srv.received).toHaveLength(0);

    await srv.listen(port);
    cleanups.push(() => srv.close());
    srv.state.mode = 'down-503'; // back, but answering 503 for a while: still retried
    await waitFor(() => events.filter((e) => e.kind === 'waiting' && /503/.test(e.reason)).length >= 1, 'a 503 retry');
    srv.state.mode = 'ok';
    await waitFor(() => srv.received.length === 2, 'both files after the outage');
    expect(new Set(srv.received.map((r) => r.name))).toEqual(new Set(['a.csv', 'b.csv']));
  });

  it('stops with a clear event when the token is refused, and sends nothing', async () => {
    const srv = fakeServer();
    const port = await srv.listen();
    cleanups.push(() => srv.close());
    const { folder, journalFile } = setup();
    fs.writeFileSync(path.join(folder, 'pull.csv'), 'rpm,torque\n2000,80\n');
    const { agent, events } = startAgent(`http://127.0.0.1:${port}`, folder, journalFile, 'revoked-token');
    await agent.start();
    const done = await agent.done;
    expect(done.tokenRefused).toBe(true);
    expect(events.some((e) => e.kind === 'token-refused')).toBe(true);
    expect(srv.received).toHaveLength(0);
    expect(fs.existsSync(journalFile)).toBe(false);
  });
});

describe('sync agent against a server without the device route', () => {
  it('stops with a clear message instead of marking files as sent or refused', async () => {
    const app = express();
    const server = await new Promise<http.Server>((resolve) => {
      const s = app.listen(0, '127.0.0.1', () => resolve(s));
    });
    cleanups.push(() => new Promise<void>((r) => server.close(() => r())));
    const { folder, journalFile } = setup();
    fs.writeFileSync(path.join(folder, 'pull.csv'), 'rpm,torque\n2000,80\n');
    const { agent, events } = startAgent(`http://127.0.0.1:${(server.address() as AddressInfo).port}`, folder, journalFile);
    await agent.start();
    expect((await agent.done).tokenRefused).toBe(false);
    expect(events.find((e) => e.kind === 'fatal')).toMatchObject({ message: expect.stringContaining('/api/device/runs does not exist') });
    expect(fs.existsSync(journalFile)).toBe(false);
  });
});

describe('run-file names and backoff', () => {
  it('takes run-file endings only, never hidden or temporary files', () => {
    expect(['pull.csv', 'PULL.TXT', 'a/b/log.tsv', 'x.log', 'y.dat'].map(isRunFileName)).toEqual([true, true, true, true, true]);
    expect(['.pull.csv', '~$pull.csv', 'pull.csv~', 'pull.xlsx', 'report.pdf'].map(isRunFileName)).toEqual([false, false, false, false, false]);
  });

  it('doubles the wait from the first delay up to the cap, with at most 20 % jitter off', () => {
    expect([0, 1, 2, 3, 10].map((a) => backoffDelayMs(a, 1000, 60_000, () => 0))).toEqual([1000, 2000, 4000, 8000, 60_000]);
    expect(backoffDelayMs(2, 1000, 60_000, () => 1)).toBe(3200);
  });
});
