import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type http from 'node:http';
import type { AddressInfo } from 'node:net';
import express from 'express';
import { afterEach, describe, expect, it } from 'vitest';
import { SyncAgent, type AgentEvent } from '../../server/sync-agent/agent';
import { DEVICE_UPLOAD_PATH } from '@shared/schemas/device';

/** The idle agent checks in on the device route (the bay board's "agent last heard"), and stops when its token is refused. */
const cleanups: (() => unknown)[] = [];
afterEach(async () => {
  for (const c of cleanups.splice(0).reverse()) await c();
});

async function fake(mode: { refuse: boolean }) {
  const beats: { auth: string | undefined; beat: string | undefined }[] = [];
  const app = express();
  app.post(DEVICE_UPLOAD_PATH, (req, res) => {
    beats.push({ auth: req.headers.authorization, beat: req.get('x-pullbook-heartbeat') });
    if (mode.refuse) res.status(401).json({ error: { code: 'DEVICE_TOKEN_REFUSED', message: 'revoked' } });
    else res.status(204).end();
  });
  const server = await new Promise<http.Server>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  cleanups.push(() => new Promise<void>((r) => server.close(() => r())));
  return { beats, url: `http://127.0.0.1:${(server.address() as AddressInfo).port}` };
}

function agentFor(url: string) {
  const root = fs.mkdtempSync(path.join(os.tmpdir(), 'pullbook-beat-'));
  cleanups.push(() => fs.rmSync(root, { recursive: true, force: true }));
  fs.mkdirSync(path.join(root, 'runs'));
  const agent = new SyncAgent({ server: url, token: 'tok', folder: path.join(root, 'runs'), journalFile: path.join(root, 'journal.json'), settleMs: 200, heartbeatMs: 100 });
  const events: AgentEvent[] = [];
  agent.on((e) => events.push(e));
  cleanups.push(() => agent.stop());
  return { agent, events };
}

describe('sync agent heartbeat', () => {
  it('checks in while idle, with its token and the heartbeat header, and no file', async () => {
    const srv = await fake({ refuse: false });
    const { agent } = agentFor(srv.url);
    await agent.start();
    await expect.poll(() => srv.beats.length, { timeout: 3000 }).toBeGreaterThanOrEqual(3);
    expect(srv.beats.every((b) => b.auth === 'Bearer tok' && b.beat === '1')).toBe(true);
    await agent.stop();
    const after = srv.beats.length;
    await new Promise((r) => setTimeout(r, 300));
    expect(srv.beats.length).toBe(after);
  });

  it('stops, once, when the server refuses its token while idle', async () => {
    const srv = await fake({ refuse: true });
    const { agent, events } = agentFor(srv.url);
    await agent.start();
    expect((await agent.done).tokenRefused).toBe(true);
    expect(events.filter((e) => e.kind === 'token-refused')).toHaveLength(1);
  });
});
