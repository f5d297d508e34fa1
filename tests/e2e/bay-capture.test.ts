/**
 * Bay capture end to end: the real app and the real sync agent (a child process, as on the dyno
 * PC) on a temporary folder. The owner makes a device token on the Dynos page, a tuner puts a bike
 * on the dyno from the bay board, a file saved in the folder appears on the board through the
 * live feed (SSE) without a reload; a restarted agent sends nothing twice; with the server away
 * the agent waits and catches up when it returns; with the dyno cleared the next file waits in the
 * inbox.
 */
import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { syntheticRunFile } from '@server/db/synthetic-runs';
import { Run } from '@server/modules/runs/run.entity';
import { AuditEntry } from '@server/modules/audit/audit-entry.entity';
import { createTestApp, TEST_PASSWORD, type TestApp, type TestShop } from '../support/test-app';
import { ARTIFACTS, visible } from '../support/browser';
import { startAgentProcess, type AgentProcess } from '../support/agent-process';

let t: TestApp;
let shop: TestShop;
let server: http.Server;
let port: number;
let baseUrl: string;
let browser: Browser;
let dir: string;
let folder: string;
let journal: string;
let dynoId: string;
let token = '';
let agent: AgentProcess | undefined;
let board: Page;
let sseSeen = false;

const listen = () => new Promise<void>((r) => server.listen(port, '127.0.0.1', () => r()));
const stopServer = () =>
  new Promise<void>((r) => {
    server.close(() => r());
    server.closeAllConnections();
  });

async function signIn(email: string): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  const page = await context.newPage();
  page.setDefaultTimeout(15_000);
  await page.goto(`${baseUrl}/login`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(TEST_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/login'));
  return page;
}

const pullRows = () => board.locator('[data-testid=bay-pull]').count();
const runsInArchive = () => t.deps.orm.em.fork().count(Run, { shop: shop.shop.id });
const uploadsAudited = () => t.deps.orm.em.fork().count(AuditEntry, { shop: shop.shop.id, action: 'run.upload' });
const save = (name: string, seed: number) => fs.writeFileSync(path.join(folder, name), syntheticRunFile({ seed }).bytes);

beforeAll(async () => {
  const clientDir = process.env.PULLBOOK_CLIENT_DIR;
  if (!clientDir || !fs.existsSync(path.join(clientDir, 'index.html'))) throw new Error('PULLBOOK_CLIENT_DIR has no built client: run browser tests through `npm test`');
  server = http.createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  port = (server.address() as AddressInfo).port;
  baseUrl = `http://127.0.0.1:${port}`;
  t = await createTestApp({ clientDir, env: { PUBLIC_URL: baseUrl } });
  server.on('request', t.app);
  shop = await t.createShop('Harrow Lane Bay');
  const owner = await t.signIn(shop.users.owner);
  dynoId = (await owner.post('/api/dynos').send({ name: 'Bay 2 roller', kind: 'inertia' })).body.id;
  browser = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'] });
  fs.mkdirSync(ARTIFACTS, { recursive: true });
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'pb-bay-'));
  folder = path.join(dir, 'dyno-runs');
  fs.mkdirSync(folder);
  journal = path.join(dir, 'agent', 'journal.json');
}, 120_000);

afterAll(async () => {
  await agent?.stop();
  await browser?.close();
  if (server?.listening) await stopServer();
  await t?.close();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

describe('bay capture with the real sync agent', () => {
  it('makes a device token on the Dynos page, shown once', async () => {
    const page = await signIn(shop.users.owner.email);
    await page.goto(`${baseUrl}/settings/dynos`);
    await page.getByRole('button', { name: 'Device tokens of Bay 2 roller' }).click();
    await page.getByLabel('Name').fill('Bay 2 PC');
    await page.getByRole('button', { name: 'Create token' }).click();
    const shown = page.getByLabel('New device token');
    await expect.poll(() => shown.isVisible()).toBe(true);
    token = (await shown.textContent()) ?? '';
    expect(token).toMatch(/^pbd_[A-Za-z0-9_-]{40,}$/);
    await visible(page, 'it is shown only once');
    await page.screenshot({ path: path.join(ARTIFACTS, 'bay-device-token.png') });
    await page.context().close();
  });

  it('puts a bike on the dyno from the bay board and shows a saved file live', async () => {
    board = await signIn(shop.users.tuner.email);
    board.on('response', (r) => {
      if (r.url().includes('/events') && (r.headers()['content-type'] ?? '').includes('text/event-stream')) sseSeen = true;
    });
    await board.goto(`${baseUrl}/bay/${dynoId}`);
    await visible(board, 'Nothing on the dyno');
    await board.getByRole('button', { name: /Put on: 2020 Testmake Own/ }).click();
    await expect.poll(() => board.getByTestId('on-dyno').textContent()).toBe('2020 Testmake Own');
    await expect.poll(() => board.getByTestId('live-state').textContent()).toBe('Live');
    expect(sseSeen).toBe(true);
    await board.evaluate(() => ((window as unknown as { bayMark: number }).bayMark = 1));

    agent = startAgentProcess({ server: baseUrl, token, folder, journal, settleMs: 300 });
    save('pull-01.csv', 101);
    await expect.poll(pullRows, { timeout: 20_000 }).toBe(1);
    // Shown without a reload: the page's own state is still there.
    expect(await board.evaluate(() => (window as unknown as { bayMark?: number }).bayMark)).toBe(1);
    await agent.waitForLine(/^sent\s+pull-01\.csv → 2020 Testmake Own: 1 new run/);
    await visible(board, 'Gain over baseline');
    await board.screenshot({ path: path.join(ARTIFACTS, 'bay-board-live.png'), fullPage: true });
  });

  it('sends nothing twice after the agent restarts', async () => {
    expect(await agent!.stop()).toBe(0);
    agent = startAgentProcess({ server: baseUrl, token, folder, journal, settleMs: 300 });
    await agent.waitForLine(/1 file was sent before and skipped/);
    expect(agent.lines.some((l) => /^sent\s/.test(l))).toBe(false);
    expect(await runsInArchive()).toBe(1);
    expect(await uploadsAudited()).toBe(1);
    expect(await pullRows()).toBe(1);
  });

  it('waits while the server is away and catches up when it returns', async () => {
    await stopServer();
    const from = agent!.lines.length;
    save('pull-02.csv', 102);
    await agent!.waitForLine(/^waiting\s+pull-02\.csv: server not reachable/, 20_000, from);
    expect(await runsInArchive()).toBe(1);
    await listen();
    await agent!.waitForLine(/^sent\s+pull-02\.csv → 2020 Testmake Own: 1 new run/, 30_000, from);
    // The board's event stream reconnects by itself and shows the pull.
    await expect.poll(pullRows, { timeout: 20_000 }).toBe(2);
    expect(await runsInArchive()).toBe(2);
    // A 10-inch tablet in landscape, at arm's length.
    await board.setViewportSize({ width: 1180, height: 820 });
    await visible(board, /2 pulls within/);
    await board.screenshot({ path: path.join(ARTIFACTS, 'bay-board-tablet.png') });
    await board.setViewportSize({ width: 1280, height: 800 });
  });

  it('puts the next file in the inbox once the dyno is cleared', async () => {
    await board.getByRole('button', { name: 'Clear dyno' }).click();
    await visible(board, 'Nothing on the dyno');
    const from = agent!.lines.length;
    save('pull-03.csv', 103);
    await agent!.waitForLine(/^sent\s+pull-03\.csv → the inbox \(nothing was on the dyno\): 1 pull/, 20_000, from);
    expect(await runsInArchive()).toBe(2);
    await board.goto(`${baseUrl}/inbox`);
    await visible(board, 'pull-03.csv');
    await visible(board, 'Bay 2 roller');
    await board.screenshot({ path: path.join(ARTIFACTS, 'bay-inbox.png'), fullPage: true });
  });

  it('puts the bike back on the dyno from the bike page in one tap', async () => {
    await board.goto(`${baseUrl}/bikes/${shop.bike.id}`);
    await board.getByRole('button', { name: 'Put on dyno' }).click();
    await visible(board, 'On Bay 2 roller now');
    await board.getByRole('link', { name: 'Bay board' }).last().click();
    await expect.poll(() => board.getByTestId('on-dyno').textContent()).toBe('2020 Testmake Own');
    await expect.poll(pullRows).toBe(2); // today's session again, with its two pulls
  });
});
