import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { runFile, type Agent } from '../support/run-fixtures';
import { renderRunFile, threePullLog } from '@server/db/synthetic-runs';
import { DEVICE_UPLOAD_PATH, type DeviceUploadResponse } from '@shared/schemas/device';
import type { BayBoardDto, DeviceTokenDto, InboxItemDto } from '@shared/schemas/bay';
import { DeviceToken } from '@server/modules/device/device-token.entity';
import { AuditEntry } from '@server/modules/audit/audit-entry.entity';
import { Run } from '@server/modules/runs/run.entity';
import { startOfDayIn } from '@shared/time-zone';

/**
 * Bay capture through the real app: device tokens (upload only), what is on the dyno now, files
 * from the sync agent landing in the dyno's session or the inbox, assigning from the inbox, the
 * bay board, and the live feed (SSE over LISTEN/NOTIFY, also across two app instances).
 */
let t: TestApp;
let a: TestShop;
let b: TestShop;
let owner: Agent;
let tuner: Agent;
let desk: Agent;
let dynoId: string;
let token: string;

const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');

function deviceSend(app: TestApp, bearer: string, name: string, bytes: Buffer) {
  return app.request.post(DEVICE_UPLOAD_PATH).set('Authorization', `Bearer ${bearer}`).attach('files', bytes, { filename: name, contentType: 'text/csv' });
}

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Bay Alpha');
  b = await t.createShop('Bay Beta');
  owner = await t.signIn(a.users.owner);
  tuner = await t.signIn(a.users.tuner);
  desk = await t.signIn(a.users.desk);
  dynoId = (await owner.post('/api/dynos').send({ name: 'Bay 1 roller', kind: 'inertia' })).body.id;
});
afterAll(() => t.close());

describe('device tokens', () => {
  it('are made by the owner, shown once, stored as a SHA-256 hash and listed with their last use', async () => {
    expect((await tuner.post(`/api/dynos/${dynoId}/device-tokens`).send({ name: 'Bay 1 PC' })).status).toBe(403);
    expect((await owner.post(`/api/dynos/${dynoId}/device-tokens`).send({ name: '' })).status).toBe(400);
    const res = await owner.post(`/api/dynos/${dynoId}/device-tokens`).send({ name: 'Bay 1 PC' });
    expect(res.status).toBe(201);
    expect(res.headers['cache-control']).toBe('no-store');
    token = res.body.token;
    expect(token.length).toBeGreaterThan(40);
    const row = await t.deps.orm.em.fork().findOneOrFail(DeviceToken, { id: res.body.id });
    expect(row.tokenHash).toBe(sha256(token));
    expect(JSON.stringify(row)).not.toContain(token);

    const list = await owner.get(`/api/dynos/${dynoId}/device-tokens`);
    expect(list.body.items).toHaveLength(1);
    expect(list.body.items[0]).toMatchObject({ id: res.body.id, name: 'Bay 1 PC', lastUsedAt: null, revokedAt: null });
    expect(JSON.stringify(list.body)).not.toContain(token);
    // Another shop sees neither the dyno nor its tokens.
    const bOwner = await t.signIn(b.users.owner);
    expect((await bOwner.get(`/api/dynos/${dynoId}/device-tokens`)).status).toBe(404);
    expect((await bOwner.post(`/api/dynos/${dynoId}/device-tokens`).send({ name: 'x' })).status).toBe(404);

    const audit = await t.deps.orm.em.fork().find(AuditEntry, { shop: a.shop.id, action: 'device-token.create' });
    expect(audit.map((e) => e.entityId)).toEqual([res.body.id]);
  });

  it('upload run files and nothing else: any other route answers 403, never falls through to a session', async () => {
    for (const [method, path] of [
      ['get', '/api/dynos'],
      ['get', '/api/runs'],
      ['post', '/api/runs'],
      ['get', `/api/dynos/${dynoId}/board`],
      ['get', '/api/auth/me'],
    ] as const) {
      const res = await t.request[method](path).set('Authorization', `Bearer ${token}`);
      expect(res.status, `${method} ${path}`).toBe(403);
      expect(res.body.error.code).toBe('DEVICE_TOKEN_NOT_HERE');
    }
    // A signed-in browser that also sends a bearer token gets no session for it either.
    const both = await owner.get('/api/dynos').set('Authorization', `Bearer ${token}`);
    expect(both.status).toBe(403);
    // The device route itself: a person is refused, and so is a wrong token or none.
    expect((await owner.post(DEVICE_UPLOAD_PATH).attach('files', runFile(1), 'x.csv')).status).toBe(403);
    expect((await t.request.post(DEVICE_UPLOAD_PATH).attach('files', runFile(1), 'x.csv')).status).toBe(401);
    // A heartbeat (no file) is only "the agent is running": 204, and the token's last use is set.
    const beat = await t.request.post(DEVICE_UPLOAD_PATH).set('Authorization', `Bearer ${token}`).set('X-Pullbook-Heartbeat', '1');
    expect(beat.status).toBe(204);
    expect((await owner.get(`/api/dynos/${dynoId}/device-tokens`)).body.items[0].lastUsedAt).not.toBeNull();
    expect((await t.request.post(DEVICE_UPLOAD_PATH).set('Authorization', `Bearer ${token}`)).status).toBe(400);
    const wrong = await deviceSend(t, `${token}x`, 'x.csv', runFile(1));
    expect(wrong.status).toBe(401);
    expect(wrong.body.error.code).toBe('DEVICE_TOKEN_REFUSED');
    expect((await t.request.get('/api/dynos').set('Authorization', 'Basic abc')).status).toBe(401);
  });
});

describe('on the dyno now', () => {
  let sessionId: string;

  it('uses or starts today’s session with the shop’s default correction and conditions to confirm', async () => {
    expect((await desk.put(`/api/dynos/${dynoId}/current`).send({ bikeId: a.bike.id })).status).toBe(403);
    const res = await tuner.put(`/api/dynos/${dynoId}/current`).send({ bikeId: a.bike.id });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ bikeId: a.bike.id, stageId: null });
    sessionId = res.body.sessionId;
    const session = (await tuner.get(`/api/sessions/${sessionId}`)).body;
    expect(session).toMatchObject({ bikeId: a.bike.id, dynoId, correctionStandard: 'sae-j1349', ambientTempC: null, conditionsToConfirm: true, safetyConfirmedAt: null });
    // Set again the same day: the same session, not a new one.
    expect((await tuner.put(`/api/dynos/${dynoId}/current`).send({ bikeId: a.bike.id })).body.sessionId).toBe(sessionId);
    const board: BayBoardDto = (await desk.get(`/api/dynos/${dynoId}/board`)).body;
    expect(board.current).toMatchObject({ bikeId: a.bike.id, bikeLabel: '2020 Testmake Own', stage: null });
    expect(board.current!.session.conditionsToConfirm).toBe(true);
    // Entering the conditions by hand clears the flag.
    await tuner.patch(`/api/sessions/${sessionId}`).send({ ambientTempC: 21, baroKpa: 100.2, humidityPct: 40 });
    expect((await tuner.get(`/api/sessions/${sessionId}`)).body.conditionsToConfirm).toBe(false);
  });

  it('counts "today" in the shop’s time zone, not in UTC', async () => {
    const bOwner = await t.signIn(b.users.owner);
    const shop = (await bOwner.get('/api/shop')).body;
    const base = { name: shop.name, units: shop.units, paperSize: shop.paperSize, defaultCorrection: shop.defaultCorrection };
    const refused = await bOwner.put('/api/shop').send({ ...base, timeZone: 'Mars/Olympus_Mons' });
    expect(refused.status).toBe(400);
    expect(JSON.stringify(refused.body)).toContain('time zone');
    // A zone far from UTC, so its calendar day and the UTC day begin at different instants.
    const zone = 'Pacific/Kiritimati';
    expect((await bOwner.put('/api/shop').send({ ...base, timeZone: zone })).body.timeZone).toBe(zone);
    const bDyno = (await bOwner.post('/api/dynos').send({ name: 'Far bay', kind: 'inertia' })).body.id;
    const now = new Date();
    const localStart = startOfDayIn(zone, now).getTime();
    const utcStart = Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate());
    // A session inside one of the two "todays" but not the other: reused only if in the shop's.
    const inShopDayOnly = localStart < utcStart;
    const startedAt = new Date((inShopDayOnly ? localStart : utcStart) + 60_000);
    const earlier = (await bOwner.post('/api/sessions').send({ bikeId: b.bike.id, dynoId: bDyno, startedAt })).body.id;
    const set = (await bOwner.put(`/api/dynos/${bDyno}/current`).send({ bikeId: b.bike.id })).body;
    if (inShopDayOnly) expect(set.sessionId).toBe(earlier);
    else expect(set.sessionId).not.toBe(earlier);
  });

  it('checks that the bike, session and stage belong to the shop and fit together', async () => {
    const otherSession = await tuner.post('/api/sessions').send({ bikeId: a.otherBike.id });
    const wrongSession = await tuner.put(`/api/dynos/${dynoId}/current`).send({ bikeId: a.bike.id, sessionId: otherSession.body.id });
    expect(wrongSession.status).toBe(400);
    expect(wrongSession.body.error.code).toBe('SESSION_OTHER_BIKE');
    const otherStage = await tuner.post('/api/stages').send({ bikeId: a.otherBike.id, name: 'Baseline' });
    expect(otherStage.status).toBe(201);
    const wrongStage = await tuner.put(`/api/dynos/${dynoId}/current`).send({ bikeId: a.bike.id, stageId: otherStage.body.id });
    expect(wrongStage.body.error.code).toBe('STAGE_OTHER_BIKE');
    expect((await tuner.put(`/api/dynos/${dynoId}/current`).send({ bikeId: b.bike.id })).status).toBe(404);
    const bTuner = await t.signIn(b.users.tuner);
    expect((await bTuner.put(`/api/dynos/${dynoId}/current`).send({ bikeId: b.bike.id })).status).toBe(404);
    // Still what was set before.
    expect((await tuner.get(`/api/dynos/${dynoId}/board`)).body.current.session.id).toBe(sessionId);
  });

  it('lands the agent’s files in the dyno’s session and stage, updates last use, and answers duplicates', async () => {
    const stage = await tuner.post('/api/stages').send({ bikeId: a.bike.id, name: 'Baseline' });
    await tuner.put(`/api/dynos/${dynoId}/current`).send({ bikeId: a.bike.id, sessionId, stageId: stage.body.id });
    const res = await deviceSend(t, token, 'pull-01.csv', runFile(11));
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(201);
    const body = res.body as DeviceUploadResponse;
    expect(body.landing).toMatchObject({ kind: 'dyno', bikeId: a.bike.id, sessionId, stageId: stage.body.id });
    expect(body.results).toHaveLength(1);
    expect(body.results[0]).toMatchObject({ ok: true, run: { sessionId, stageId: stage.body.id, bikeId: a.bike.id } });

    const again = await deviceSend(t, token, 'pull-01-copy.csv', runFile(11));
    expect(again.body.results[0]).toMatchObject({ ok: true, duplicate: true });
    expect(await t.deps.orm.em.fork().count(Run, { session: sessionId })).toBe(1);

    const tokens: DeviceTokenDto[] = (await owner.get(`/api/dynos/${dynoId}/device-tokens`)).body.items;
    expect(tokens[0].lastUsedAt).not.toBeNull();
    const board: BayBoardDto = (await tuner.get(`/api/dynos/${dynoId}/board`)).body;
    expect(board.agentLastHeardAt).not.toBeNull();
    expect(board.activeTokens).toBe(1);
    const audit = await t.deps.orm.em.fork().findOneOrFail(AuditEntry, { shop: a.shop.id, action: 'run.upload', entityId: body.results[0].ok ? body.results[0].run.id : '' });
    expect(String(audit.details?.via)).toContain('Bay 1 PC');
  });

  it('makes several runs of a multi-pull log and shows each pull against the reference on the board', async () => {
    const log = Buffer.from(renderRunFile(threePullLog(5)).bytes);
    const res = await deviceSend(t, token, 'three-pulls.csv', log);
    expect(res.status).toBe(201);
    expect(res.body.results[0].pullCount).toBe(3);
    const board: BayBoardDto = (await tuner.get(`/api/dynos/${dynoId}/board`)).body;
    expect(board.pulls).toHaveLength(4);
    // No stage reference yet: the baseline is the session's first readable pull.
    expect(board.reference?.kind).toBe('baseline');
    expect(board.reference?.pull.run.id).toBe(board.pulls[0].run.id);
    const ready = board.pulls.filter((p) => p.run.status === 'ready');
    for (const p of ready) {
      expect(p.peakPowerHp).toBeCloseTo(p.run.peakPowerHp!, 1);
      if (p.run.id === board.reference!.pull.run.id) expect(p.gain).toBeNull();
      // Gain in peak power is this pull's corrected peak minus the reference's (definition of the gain figure).
      else if (p.gain) expect(p.gain.peakPowerHp).toBeCloseTo(p.peakPowerHp! - board.reference!.pull.peakPowerHp!, 1);
    }
    // Spread: the range (max − min) of the pulls' peak power, in words.
    const peaks = ready.map((p) => p.peakPowerHp!);
    expect(board.spread?.pulls).toBe(ready.length);
    expect(board.spread?.peakPowerSpreadHp).toBeCloseTo(Math.max(...peaks) - Math.min(...peaks), 1);
    expect(board.spread?.text).toBe(`${ready.length} pulls within ${board.spread!.peakPowerSpreadHp.toFixed(1)} hp`);
  });
});

describe('the inbox', () => {
  let itemId: string;
  const FILE = runFile(21);

  it('keeps files that arrive with nothing on the dyno, and answers the same file again as waiting', async () => {
    expect((await tuner.delete(`/api/dynos/${dynoId}/current`)).status).toBe(204);
    expect((await tuner.get(`/api/dynos/${dynoId}/board`)).body.current).toBeNull();
    const res = await deviceSend(t, token, 'lonely.csv', FILE);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ landing: { kind: 'inbox', duplicate: false, pulls: 1 }, results: [] });
    itemId = res.body.landing.itemId;
    const again = await deviceSend(t, token, 'lonely.csv', FILE);
    expect(again.body.landing).toMatchObject({ kind: 'inbox', itemId, duplicate: true });

    const list = await desk.get('/api/runs/inbox');
    expect(list.status).toBe(200);
    const items: InboxItemDto[] = list.body.items;
    expect(items).toHaveLength(1);
    expect(items[0]).toMatchObject({ id: itemId, originalName: 'lonely.csv', dynoId, dynoName: 'Bay 1 roller', sizeBytes: FILE.length, sha256: createHash('sha256').update(FILE).digest('hex'), repeats: 1 });
    expect(items[0].summary).toMatchObject({ pulls: 1, readable: 1, error: null });
    expect((await (await t.signIn(a.users.customer)).get('/api/runs/inbox')).status).toBe(403);
    expect((await (await t.signIn(b.users.owner)).get('/api/runs/inbox')).body.items).toEqual([]);
  });

  it('assigns a waiting file through the upload pipeline, once', async () => {
    const bad = await desk.post(`/api/runs/inbox/${itemId}/assign`).send({ bikeId: b.bike.id });
    expect(bad.status).toBe(404);
    const res = await desk.post(`/api/runs/inbox/${itemId}/assign`).send({ bikeId: a.otherBike.id });
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
    expect(res.body.results[0]).toMatchObject({ ok: true, run: { bikeId: a.otherBike.id, sessionId: null, originalName: 'lonely.csv' } });
    expect((await desk.get('/api/runs/inbox')).body.items).toEqual([]);
    const twice = await desk.post(`/api/runs/inbox/${itemId}/assign`).send({ bikeId: a.otherBike.id });
    expect(twice.status).toBe(409);
    expect(twice.body.error.code).toBe('INBOX_ALREADY_ASSIGNED');
    // The same file from the dyno again waits again; assigned to the same bike it is answered as already archived.
    const back = await deviceSend(t, token, 'lonely.csv', FILE);
    expect(back.body.landing.duplicate).toBe(false);
    const dup = await desk.post(`/api/runs/inbox/${back.body.landing.itemId}/assign`).send({ bikeId: a.otherBike.id });
    expect(dup.body.results[0]).toMatchObject({ ok: true, duplicate: true });
    expect(await t.deps.orm.em.fork().count(Run, { bike: a.otherBike.id, rawSha256: createHash('sha256').update(FILE).digest('hex') })).toBe(1);
  });

  it('refuses a revoked token at once', async () => {
    const tokens: DeviceTokenDto[] = (await owner.get(`/api/dynos/${dynoId}/device-tokens`)).body.items;
    expect((await tuner.delete(`/api/dynos/${dynoId}/device-tokens/${tokens[0].id}`)).status).toBe(403);
    expect((await owner.delete(`/api/dynos/${dynoId}/device-tokens/${tokens[0].id}`)).status).toBe(204);
    const res = await deviceSend(t, token, 'late.csv', runFile(31));
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('DEVICE_TOKEN_REFUSED');
    const listed: DeviceTokenDto[] = (await owner.get(`/api/dynos/${dynoId}/device-tokens`)).body.items;
    expect(listed[0].revokedAt).not.toBeNull();
    const audit = await t.deps.orm.em.fork().find(AuditEntry, { shop: a.shop.id, action: 'device-token.revoke' });
    expect(audit).toHaveLength(1);
  });
});

/** Reads an SSE stream from a listening app; resolves events as they come. */
function openEvents(port: number, cookie: string, sessionId: string) {
  const events: { event: string; data: string }[] = [];
  let text = '';
  let listening = false;
  const req = http.get({ host: '127.0.0.1', port, path: `/api/sessions/${sessionId}/events`, headers: { cookie, accept: 'text/event-stream' } });
  const opened = new Promise<http.IncomingMessage>((resolve, reject) => {
    req.on('response', (res) => {
      res.setEncoding('utf8');
      res.on('data', (chunk: string) => {
        text += chunk;
        let i;
        while ((i = text.indexOf('\n\n')) >= 0) {
          const block = text.slice(0, i);
          text = text.slice(i + 2);
          if (block.startsWith(': listening')) listening = true;
          const event = /^event: (.*)$/m.exec(block)?.[1];
          const data = /^data: (.*)$/m.exec(block)?.[1];
          if (event) events.push({ event, data: data ?? '' });
        }
      });
      resolve(res);
    });
    req.on('error', reject);
  });
  return {
    opened,
    events,
    isListening: () => listening,
    close: () => req.destroy(),
  };
}

async function waitFor(cond: () => boolean, what: string, ms = 8000) {
  const t0 = Date.now();
  while (!cond()) {
    if (Date.now() - t0 > ms) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

async function listen(app: TestApp): Promise<{ port: number; server: http.Server }> {
  const server = await new Promise<http.Server>((resolve) => {
    const s = app.app.listen(0, '127.0.0.1', () => resolve(s));
  });
  return { port: (server.address() as AddressInfo).port, server };
}

async function sessionCookie(app: TestApp, email: string): Promise<string> {
  const res = await app.request.post('/api/auth/login').send({ email, password: 'correct-horse-battery' });
  return (res.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
}

describe('live session events (SSE over LISTEN/NOTIFY)', () => {
  it('sends one run event per new run, and a resync after the listening connection was lost', async () => {
    const fresh = (await owner.post(`/api/dynos/${dynoId}/device-tokens`).send({ name: 'Bay 1 PC (new)' })).body.token as string;
    const { sessionId } = (await tuner.put(`/api/dynos/${dynoId}/current`).send({ bikeId: a.bike.id })).body;
    const { port, server } = await listen(t);
    const stream = openEvents(port, await sessionCookie(t, a.users.tuner.email), sessionId);
    try {
      const res = await stream.opened;
      expect(res.statusCode).toBe(200);
      expect(res.headers['content-type']).toContain('text/event-stream');
      await waitFor(stream.isListening, 'the stream to listen');
      const sent = await deviceSend(t, fresh, 'live-1.csv', runFile(41));
      const runId = sent.body.results[0].run.id;
      await waitFor(() => stream.events.some((e) => e.event === 'run'), 'a run event');
      const runEvents = stream.events.filter((e) => e.event === 'run');
      expect(runEvents).toHaveLength(1);
      expect(JSON.parse(runEvents[0].data)).toMatchObject({ runId, sessionId, op: 'insert' });
      // A change to the run (a note) is an event too.
      await tuner.patch(`/api/runs/${runId}`).send({ note: 'fan moved closer' });
      await waitFor(() => stream.events.filter((e) => e.event === 'run').length === 2, 'a second run event');

      // The listening connection is cut (a database restart, a failover): it comes back and says resync.
      await t.deps.orm.em.getConnection().execute(`select pg_terminate_backend(pid) from pg_stat_activity where query ilike 'listen pullbook_run%' and datname = current_database()`);
      await waitFor(() => stream.events.some((e) => e.event === 'resync'), 'a resync event', 10_000);
      await deviceSend(t, fresh, 'live-2.csv', runFile(42));
      await waitFor(() => stream.events.filter((e) => e.event === 'run').length === 3, 'a run event after the reconnect');
      // Another shop cannot open the stream of this session.
      const bOwner = await t.signIn(b.users.owner);
      expect((await bOwner.get(`/api/sessions/${sessionId}/events`)).status).toBe(404);
    } finally {
      stream.close();
      server.close();
    }
  });

  it('reaches a browser on another app instance than the one that stored the run', async () => {
    const second = await createTestApp({ databaseUrl: t.deps.config.DATABASE_URL });
    const { port, server } = await listen(second);
    const fresh = (await owner.post(`/api/dynos/${dynoId}/device-tokens`).send({ name: 'Bay 1 PC (other instance)' })).body.token as string;
    const { sessionId } = (await tuner.put(`/api/dynos/${dynoId}/current`).send({ bikeId: a.bike.id })).body;
    const stream = openEvents(port, await sessionCookie(second, a.users.desk.email), sessionId);
    try {
      const opened = await stream.opened;
      expect(opened.statusCode).toBe(200);
      await waitFor(stream.isListening, 'the second instance to listen');
      const sent = await deviceSend(t, fresh, 'live-3.csv', runFile(43));
      await waitFor(() => stream.events.some((e) => e.event === 'run'), 'a run event on the other instance');
      expect(JSON.parse(stream.events.find((e) => e.event === 'run')!.data).runId).toBe(sent.body.results[0].run.id);
    } finally {
      stream.close();
      server.close();
      await second.close();
    }
  });
});
