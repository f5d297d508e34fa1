/**
 * axe (WCAG 2.0, 2.1 and 2.2, levels A and AA) on every page for every role, at a desk width
 * (1280 px) and a bay-tablet width (768 px), on the invented demo archive. Any violation fails the
 * test, and every one is printed (rule, impact, page, role, width, the nodes' selectors).
 *
 * To add a page: append a line to PAGES with the roles that use it (a role that may not see it
 * still visits it once, see FORBIDDEN_SAMPLES, so the plain "not for your role" page is checked).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { AxeBuilder } from '@axe-core/playwright';
import type { Result } from 'axe-core';
import { startBrowserHarness, type BrowserHarness } from '../support/browser';
import { DEMO_PASSWORD, seedDemoIfEmpty, type DemoIds } from '@server/db/demo-seed';
import '@server/db/demo-archive';

type Who = 'owner' | 'tuner' | 'desk' | 'customer' | 'anonymous';
const STAFF: Who[] = ['owner', 'tuner', 'desk'];
const EVERYONE_SIGNED_IN: Who[] = [...STAFF, 'customer'];
const WIDTHS = [1280, 768] as const;
const TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];
/** axe's rules for these criteria that it leaves off by default (marked experimental): on here too. */
const EXPERIMENTAL_WCAG_RULES = ['label-content-name-mismatch', 'css-orientation-lock', 'p-as-heading', 'table-fake-caption', 'td-has-header'];

/** What the pages need: ids from the demo archive (found through the API after seeding). */
interface Ids {
  bikeId: string;
  customerId: string;
  runId: string;
  sessionId: string;
  comparisonId: string;
  reportId: string;
  shareToken: string;
  dynoId: string;
  planId: string;
  planToken: string;
}

interface PageSpec {
  name: string;
  path: (ids: Ids) => string;
  roles: Who[];
  /** Text that shows the page has loaded (default: its h1). */
  ready?: string | RegExp;
}

/** Every screen. New pages: one line each. */
const PAGES: PageSpec[] = [
  { name: 'sign in', path: () => '/login', roles: ['anonymous'] },
  { name: 'forgot password', path: () => '/forgot-password', roles: ['anonymous'] },
  { name: 'share link', path: (i) => `/share/${i.shareToken}`, roles: ['anonymous'], ready: /Gain report ·/ },
  { name: 'start page', path: () => '/', roles: EVERYONE_SIGNED_IN },
  { name: 'runs', path: () => '/runs', roles: STAFF },
  { name: 'upload', path: () => '/upload', roles: ['owner', 'tuner'] },
  { name: 'customers', path: () => '/customers', roles: STAFF },
  { name: 'customer', path: (i) => `/customers/${i.customerId}`, roles: STAFF },
  { name: 'bikes', path: () => '/bikes', roles: STAFF },
  { name: 'bike', path: (i) => `/bikes/${i.bikeId}`, roles: EVERYONE_SIGNED_IN, ready: 'Gains by stage' },
  { name: 'run', path: (i) => `/runs/${i.runId}`, roles: EVERYONE_SIGNED_IN },
  { name: 'session', path: (i) => `/sessions/${i.sessionId}`, roles: STAFF },
  { name: 'comparisons', path: () => '/comparisons', roles: EVERYONE_SIGNED_IN },
  { name: 'new comparison', path: (i) => `/comparisons/new?bikeId=${i.bikeId}`, roles: STAFF },
  { name: 'comparison', path: (i) => `/comparisons/${i.comparisonId}`, roles: EVERYONE_SIGNED_IN },
  { name: 'gain reports', path: () => '/reports', roles: STAFF },
  { name: 'gain report', path: (i) => `/reports/${i.reportId}`, roles: EVERYONE_SIGNED_IN },
  { name: 'build finder', path: () => '/finder', roles: STAFF },
  { name: 'my account', path: () => '/account', roles: EVERYONE_SIGNED_IN },
  { name: 'users', path: () => '/settings/users', roles: ['owner'] },
  { name: 'shop settings', path: () => '/settings/shop', roles: ['owner'] },
  { name: 'dynos', path: () => '/settings/dynos', roles: ['owner'] },
  { name: 'audit log', path: () => '/settings/audit', roles: ['owner'] },
  { name: 'outbox', path: () => '/settings/outbox', roles: ['owner'] },
  { name: 'bay boards', path: () => '/bay', roles: STAFF },
  { name: 'bay board', path: (i) => `/bay/${i.dynoId}`, roles: STAFF },
  { name: 'inbox', path: () => '/inbox', roles: STAFF },
  { name: 'build plan', path: (i) => `/plans/${i.planId}`, roles: EVERYONE_SIGNED_IN },
  { name: 'build plan link', path: (i) => `/plan/${i.planToken}`, roles: ['anonymous'] },
  { name: 'not found', path: () => '/no-such-page', roles: ['owner'] },
];

/** A page a role may not use, visited once by that role: the plain refusal page is checked too. */
const FORBIDDEN_SAMPLES: { role: Who; path: string; ready: string }[] = [
  { role: 'customer', path: '/runs', ready: 'Not available for your role' },
  { role: 'desk', path: '/settings/users', ready: 'Not for your role' },
];

const EMAIL: Record<Exclude<Who, 'anonymous'>, string> = {
  owner: 'owner@demo.pullbook.test',
  tuner: 'tuner@demo.pullbook.test',
  desk: 'desk@demo.pullbook.test',
  customer: 'customer@demo.pullbook.test',
};

let h: BrowserHarness;
let ids: Ids;

async function firstItem(agent: Awaited<ReturnType<BrowserHarness['t']['signIn']>>, url: string): Promise<{ id: string } & Record<string, unknown>> {
  const res = await agent.get(url);
  expect(res.status, url).toBe(200);
  const items = (res.body.items ?? res.body) as ({ id: string } & Record<string, unknown>)[];
  expect(items.length, url).toBeGreaterThan(0);
  return items[0];
}

beforeAll(async () => {
  h = await startBrowserHarness();
  const demo: DemoIds | null = await seedDemoIfEmpty(h.t.deps);
  expect(demo).toBeTruthy();
  const desk = await h.t.signIn(EMAIL.desk, DEMO_PASSWORD);
  const bike = await firstItem(await h.t.signIn(EMAIL.customer, DEMO_PASSWORD), '/api/bikes');
  const run = await firstItem(desk, `/api/runs?bikeId=${bike.id}`);
  const session = await firstItem(desk, `/api/sessions?bikeId=${bike.id}`);
  const comparison = await firstItem(desk, `/api/comparisons?bikeId=${bike.id}`);
  const report = await firstItem(desk, `/api/reports?bikeId=${bike.id}`);
  const share = await desk.post(`/api/reports/${report.id}/share`).send({ expiresInDays: 7 });
  expect(share.status).toBe(201);
  const owner = await h.t.signIn(EMAIL.owner, DEMO_PASSWORD);
  const dynos = await owner.get('/api/dynos');
  expect(dynos.status).toBe(200);
  const dyno = ((dynos.body.items ?? dynos.body) as { id: string }[])[0];
  expect(dyno, 'a demo dyno').toBeTruthy();
  const plan = await desk.post(`/api/bikes/${bike.id}/plans`).send({
    title: 'Stage 2 — ported heads',
    items: [{ category: 'cylinder-heads', description: 'Mild port and valve job', partCostCents: 20_000, labourCostCents: 45_000, headWork: 'mild-port' }],
  });
  expect(plan.status, JSON.stringify(plan.body)).toBe(201);
  const sent = await desk.post(`/api/plans/${plan.body.id}/send`).send({});
  expect(sent.status, JSON.stringify(sent.body)).toBe(200);
  ids = {
    bikeId: bike.id,
    customerId: String(bike.customerId),
    runId: run.id,
    sessionId: session.id,
    comparisonId: comparison.id,
    reportId: report.id,
    shareToken: new URL(share.body.url as string).pathname.split('/').pop()!,
    dynoId: dyno.id,
    planId: plan.body.id as string,
    planToken: new URL(sent.body.url as string).pathname.split('/').pop()!,
  };
}, 300_000);
afterAll(() => h?.close());

interface Finding {
  where: string;
  rule: string;
  impact: string | null | undefined;
  help: string;
  nodes: string[];
}

function describeViolations(where: string, violations: Result[]): Finding[] {
  return violations.map((v) => ({
    where,
    rule: v.id,
    impact: v.impact,
    help: v.help,
    nodes: v.nodes.slice(0, 5).map((n) => `${n.target.join(' ')} — ${n.failureSummary?.split('\n').slice(1).join(' ').trim() ?? ''}`),
  }));
}

/**
 * Waits until the page has settled: its ready text or an h1 visible, nothing busy. A page that
 * never gets there is a finding too (and is still checked as it stands).
 */
async function settle(page: Page, where: string, ready?: string | RegExp): Promise<Finding[]> {
  const target = ready ? page.getByText(ready).first() : page.locator('h1').first();
  const loaded = await target.waitFor({ state: 'visible', timeout: 20_000 }).then(
    () => true,
    () => false,
  );
  await page.waitForFunction(() => !document.querySelector('[aria-busy="true"]') && !/Loading/.test(document.querySelector('main')?.textContent?.slice(0, 40) ?? ''), null, { timeout: 20_000 }).catch(() => undefined);
  // Charts animate for 250 ms; let them finish so their labels are measured as drawn.
  await page.waitForTimeout(400);
  const findings: Finding[] = [];
  if (!loaded) findings.push({ where, rule: 'page-not-ready', impact: null, help: `neither ${ready ? `“${ready}”` : 'an h1'} appeared`, nodes: [] });
  // Each page names its tab "page · shop" (or "page · Pullbook" signed out).
  const title = await page.title();
  if (!/ · /.test(title)) findings.push({ where, rule: 'own-document-title', impact: null, help: `title is “${title}”`, nodes: [] });
  return findings;
}

async function check(page: Page, where: string): Promise<Finding[]> {
  // options() replaces every option, so it goes before withTags().
  const results = await new AxeBuilder({ page })
    .options({ rules: Object.fromEntries(EXPERIMENTAL_WCAG_RULES.map((id) => [id, { enabled: true }])) })
    .withTags(TAGS)
    .analyze();
  return describeViolations(where, results.violations);
}

async function pageFor(who: Who): Promise<Page> {
  if (who === 'anonymous') return (await h.newPage()).page;
  return h.signInPage(EMAIL[who], DEMO_PASSWORD);
}

describe('accessibility (axe, WCAG 2.0/2.1/2.2 A and AA)', () => {
  const roles: Who[] = ['anonymous', 'owner', 'tuner', 'desk', 'customer'];
  for (const who of roles) {
    it(`${who}: every page at 1280 and 768 px has no violation`, async () => {
      const page = await pageFor(who);
      const findings: Finding[] = [];
      const visits = [
        ...PAGES.filter((p) => p.roles.includes(who)).map((p) => ({ name: p.name, path: p.path(ids), ready: p.ready })),
        ...FORBIDDEN_SAMPLES.filter((f) => f.role === who).map((f) => ({ name: `${f.path} (not for ${who})`, path: f.path, ready: f.ready as string | RegExp | undefined })),
      ];
      for (const width of WIDTHS) {
        await page.setViewportSize({ width, height: width === 768 ? 1024 : 800 });
        for (const v of visits) {
          const where = `${v.name} (${v.path}) as ${who} at ${width} px`;
          await page.goto(`${h.baseUrl}${v.path}`);
          findings.push(...(await settle(page, where, v.ready)));
          findings.push(...(await check(page, where)));
        }
      }
      await page.context().close();
      if (findings.length) console.log(`axe violations for ${who}:\n${JSON.stringify(findings, null, 2)}`);
      expect(findings.map((f) => `${f.rule}: ${f.where}`)).toEqual([]);
    }, 600_000);
  }
});
