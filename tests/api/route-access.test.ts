import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { ROLES, type Role } from '@shared/roles';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';

/**
 * Every registered API route × every role and an anonymous caller. A route must declare its
 * access (deny by default); this checks the declaration is what the server enforces.
 */
let t: TestApp;
let s: TestShop;
const agents = {} as Record<Role, ReturnType<typeof supertest.agent>>;

beforeAll(async () => {
  t = await createTestApp();
  s = await t.createShop('Matrix Shop');
  for (const role of ROLES) agents[role] = await t.signIn(s.users[role]);
});
afterAll(() => t.close());

function concretePath(path: string) {
  return path.replace(/:(\w+)/g, (_m, name: string) => (/token/i.test(name) ? 'x'.repeat(43) : /index/i.test(name) ? '0' : name === 'id' && path.startsWith('/api/outbox') ? 'none.eml' : randomUUID()));
}

type Layer = { route?: { path: string; methods: Record<string, boolean> }; handle?: { stack?: Layer[] } };
function countRouteLayers(stack: Layer[]): number {
  return stack.reduce((n, layer) => n + (layer.route ? Object.keys(layer.route.methods).length : layer.handle?.stack ? countRouteLayers(layer.handle.stack) : 0), 0);
}

/**
 * Expectations written down independently of the routes' own declarations, for the routes where
 * a wrong rule would hurt most. If a declaration drifts from these, this test fails.
 */
const EXPECTED: { method: string; path: string; allowed: (Role | 'anonymous')[] }[] = [
  { method: 'get', path: '/api/users/', allowed: ['owner'] },
  { method: 'post', path: '/api/users/', allowed: ['owner'] },
  { method: 'patch', path: '/api/users/:id', allowed: ['owner'] },
  { method: 'get', path: '/api/audit/', allowed: ['owner'] },
  { method: 'get', path: '/api/outbox/', allowed: ['owner'] },
  { method: 'put', path: '/api/shop/', allowed: ['owner'] },
  { method: 'post', path: '/api/dynos/', allowed: ['owner'] },
  { method: 'post', path: '/api/customers/', allowed: ['owner', 'desk'] },
  { method: 'post', path: '/api/bikes/', allowed: ['owner', 'desk'] },
  { method: 'post', path: '/api/runs/', allowed: ['owner', 'tuner'] },
  { method: 'get', path: '/api/runs/:id/raw', allowed: ['owner', 'tuner', 'desk'] },
  { method: 'delete', path: '/api/runs/:id', allowed: ['owner'] },
  { method: 'post', path: '/api/comparisons/preview', allowed: ['owner', 'tuner', 'desk'] },
  { method: 'post', path: '/api/reports/:id/send', allowed: ['owner', 'tuner', 'desk'] },
  { method: 'get', path: '/api/builds/search', allowed: ['owner', 'tuner', 'desk'] },
  { method: 'get', path: '/api/bikes/:id/similar', allowed: ['owner', 'tuner', 'desk'] },
  { method: 'get', path: '/api/bikes/', allowed: ['owner', 'tuner', 'desk', 'customer'] },
  { method: 'get', path: '/api/health/', allowed: ['anonymous', 'owner', 'tuner', 'desk', 'customer'] },
  { method: 'get', path: '/api/share/:token', allowed: ['anonymous', 'owner', 'tuner', 'desk', 'customer'] },
  // Bay capture: the device route admits no person at all (its caller is a device token).
  { method: 'post', path: '/api/device/runs', allowed: [] },
  { method: 'get', path: '/api/dynos/:id/device-tokens', allowed: ['owner'] },
  { method: 'post', path: '/api/dynos/:id/device-tokens', allowed: ['owner'] },
  { method: 'delete', path: '/api/dynos/:id/device-tokens/:tokenId', allowed: ['owner'] },
  { method: 'put', path: '/api/dynos/:id/current', allowed: ['owner', 'tuner'] },
  { method: 'delete', path: '/api/dynos/:id/current', allowed: ['owner', 'tuner'] },
  { method: 'get', path: '/api/dynos/:id/board', allowed: ['owner', 'tuner', 'desk'] },
  { method: 'get', path: '/api/runs/inbox/', allowed: ['owner', 'tuner', 'desk'] },
  { method: 'post', path: '/api/runs/inbox/:id/assign', allowed: ['owner', 'tuner', 'desk'] },
  { method: 'get', path: '/api/sessions/:id/events', allowed: ['owner', 'tuner', 'desk', 'customer'] },
  { method: 'post', path: '/api/bikes/:id/plans', allowed: ['owner', 'tuner', 'desk'] },
  { method: 'get', path: '/api/bikes/:id/plans', allowed: ['owner', 'tuner', 'desk', 'customer'] },
  { method: 'get', path: '/api/plans/:id', allowed: ['owner', 'tuner', 'desk', 'customer'] },
  { method: 'put', path: '/api/plans/:id', allowed: ['owner', 'tuner', 'desk'] },
  { method: 'post', path: '/api/plans/:id/send', allowed: ['owner', 'tuner', 'desk'] },
  { method: 'post', path: '/api/plans/:id/accept', allowed: ['customer'] },
  { method: 'post', path: '/api/plans/:id/decline', allowed: ['customer'] },
  { method: 'post', path: '/api/plans/:id/deposit', allowed: ['customer'] },
  { method: 'post', path: '/api/plans/:id/refund', allowed: ['owner', 'desk'] },
  { method: 'post', path: '/api/plans/:id/convert', allowed: ['owner', 'tuner'] },
  { method: 'post', path: '/api/plan-links/:token/accept', allowed: ['anonymous', 'owner', 'tuner', 'desk', 'customer'] },
  { method: 'post', path: '/api/payments/webhook', allowed: ['anonymous', 'owner', 'tuner', 'desk', 'customer'] },
];

describe('route × role matrix', () => {
  it('declares the independently expected rules on the sensitive routes', () => {
    for (const e of EXPECTED) {
      const r = t.routes.find((x) => x.method === e.method && x.path === e.path);
      expect(r, `${e.method.toUpperCase()} ${e.path} is registered`).toBeTruthy();
      const declared = (['anonymous', ...ROLES] as const).filter((who) =>
        r!.access === 'public' ? true : who === 'anonymous' ? false : r!.access === 'signed-in' ? true : r!.access.includes(who),
      );
      expect(declared, `${e.method.toUpperCase()} ${e.path}`).toEqual(['anonymous', ...ROLES].filter((w) => e.allowed.includes(w as Role | 'anonymous')));
    }
  });

  it('has every Express route in the access registry', () => {
    const stack = (t.app as unknown as { router: { stack: Layer[] } }).router.stack;
    expect(t.routes.length).toBeGreaterThan(15);
    expect(countRouteLayers(stack)).toBe(t.routes.length);
  });

  it('declares an access rule on every route', () => {
    for (const r of t.routes) {
      expect(r.access === 'public' || r.access === 'signed-in' || r.access === 'device' || (Array.isArray(r.access) && r.access.length > 0), `${r.method} ${r.path}`).toBe(true);
    }
  });

  it('enforces each route’s rule for every role and for anonymous callers', async () => {
    const problems: string[] = [];
    for (const r of t.routes) {
      const path = concretePath(r.path);
      const callers: (Role | 'anonymous')[] = ['anonymous', ...ROLES];
      for (const who of callers) {
        const client = who === 'anonymous' ? t.request : agents[who];
        const res = await (client as ReturnType<typeof supertest.agent>)[r.method](path).send({});
        // Signing out ends the agent's session; sign back in for the routes after it.
        if (r.path === '/api/auth/logout' && who !== 'anonymous') agents[who] = await t.signIn(s.users[who]);
        const allowed = r.access === 'public' || (who !== 'anonymous' && (r.access === 'signed-in' || r.access.includes(who)));
        const expected = allowed ? 'not 401/403' : who === 'anonymous' ? 401 : 403;
        const ok = allowed ? res.status !== 401 && res.status !== 403 : res.status === expected;
        if (!ok) problems.push(`${r.method.toUpperCase()} ${r.path} as ${who}: got ${res.status}, expected ${expected}`);
      }
    }
    expect(problems).toEqual([]);
  });

  it('lets a device token (Bearer) reach the device upload route and no other route', async () => {
    const dyno = await agents.owner.post('/api/dynos').send({ name: 'Matrix roller', kind: 'inertia' });
    const token = (await agents.owner.post(`/api/dynos/${dyno.body.id}/device-tokens`).send({ name: 'Matrix PC' })).body.token as string;
    expect(token).toBeTruthy();
    const problems: string[] = [];
    for (const r of t.routes) {
      if (r.path === '/api/auth/logout') continue;
      const res = await t.request[r.method](concretePath(r.path)).set('Authorization', `Bearer ${token}`).send({});
      const ok = r.access === 'device' ? res.status !== 401 && res.status !== 403 : res.status === 401 || res.status === 403;
      if (!ok) problems.push(`${r.method.toUpperCase()} ${r.path} as a device: got ${res.status}`);
    }
    expect(t.routes.filter((r) => r.access === 'device').map((r) => `${r.method} ${r.path}`)).toEqual(['post /api/device/runs']);
    expect(problems).toEqual([]);
  });
});

describe('build plans across customers and shops', () => {
  it('answers 404 for another customer’s plan and for another shop’s plan, on every plan route', async () => {
    const other = await t.createShop('Matrix Other Shop');
    const desk = agents.desk;
    const item = { category: 'exhaust', description: 'Slip-ons', partCostCents: 40_000, labourCostCents: 10_000 };
    // A sent plan on a bike of another customer of the same shop, and one in another shop.
    const mine = (await desk.post(`/api/bikes/${s.otherBike.id}/plans`).send({ title: 'Other customer', items: [item] })).body;
    expect((await desk.post(`/api/plans/${mine.id}/send`).send({ to: 'someone@matrix.test' })).status).toBe(200);
    const otherDesk = await t.signIn(other.users.desk);
    const theirs = (await otherDesk.post(`/api/bikes/${other.bike.id}/plans`).send({ title: 'Other shop', items: [item] })).body;
    expect((await otherDesk.post(`/api/plans/${theirs.id}/send`).send({})).status).toBe(200);

    const calls = (id: string): [Role, string, string, object?][] => [
      ['customer', 'get', `/api/plans/${id}`],
      ['customer', 'get', `/api/plans/${id}/pdf`],
      ['customer', 'post', `/api/plans/${id}/accept`, { name: 'Not Theirs' }],
      ['customer', 'post', `/api/plans/${id}/decline`, {}],
      ['customer', 'post', `/api/plans/${id}/deposit`, {}],
    ];
    const staffCalls = (id: string): [Role, string, string, object?][] => [
      ['owner', 'get', `/api/plans/${id}`],
      ['owner', 'put', `/api/plans/${id}`, { title: 'x', items: [item] }],
      ['desk', 'post', `/api/plans/${id}/send`, {}],
      ['owner', 'post', `/api/plans/${id}/refund`, {}],
      ['tuner', 'post', `/api/plans/${id}/convert`, {}],
      ['desk', 'get', `/api/plans/${id}/versions`],
    ];
    const problems: string[] = [];
    for (const [who, method, path, body] of [...calls(mine.id), ...calls(theirs.id), ...staffCalls(theirs.id)]) {
      const agent = agents[who] as unknown as Record<string, (p: string) => supertest.Test>;
      const res = await agent[method](path).send(body ?? {});
      if (res.status !== 404) problems.push(`${method.toUpperCase()} ${path} as ${who}: ${res.status}`);
    }
    for (const [method, path] of [['get', `/api/bikes/${s.otherBike.id}/plans`], ['get', `/api/bikes/${other.bike.id}/plans`]] as const) {
      const res = await agents.customer[method](path);
      if (res.status !== 404) problems.push(`${method.toUpperCase()} ${path} as customer: ${res.status}`);
    }
    const ownerBikes = await agents.owner.post(`/api/bikes/${other.bike.id}/plans`).send({ title: 'x', items: [item] });
    if (ownerBikes.status !== 404) problems.push(`POST /api/bikes/<other shop>/plans as owner: ${ownerBikes.status}`);
    expect(problems).toEqual([]);
  });
});
