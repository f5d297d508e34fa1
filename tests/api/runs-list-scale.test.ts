import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import type { Actor } from '@server/http/actor';
import { pageSql, totalFromWhere } from '@server/modules/runs/run-list-sql';
import { runListQuery } from '@shared/schemas/run';
import { bikeListQuery } from '@shared/schemas/bike';
import { customerListQuery } from '@shared/schemas/customer';
import { listBikes } from '@server/modules/bikes/bike.service';
import { listCustomers } from '@server/modules/customers/customer.service';
import { listStages } from '@server/modules/stages/stage.service';
import { sequenceScope } from '@server/modules/runs/run-sequence';

/**
 * The run list at archive scale (server/modules/runs/run-list-sql.ts, Migration20261202170000):
 * query plans of the hot list statements on 20 000 runs of one shop, keyset paging against
 * offset paging, search over engine family and tags, and the total (exact up to 200, else an
 * estimate). Makes, engine families and tags are invented.
 */

let t: TestApp;
let shop: TestShop;
const BIKES = 2000;
const RUNS_PER_BIKE = 10;

beforeAll(async () => {
  t = await createTestApp();
  shop = await t.createShop('Run List Scale');
  const s = shop.shop.id;
  const c = shop.customer.id;
  await t.deps.orm.em.fork().getKnex().transaction(async (trx) => {
    await trx.raw(`insert into bike (id, shop_id, customer_id, make, model, engine_family, displacement_cc, cylinders, created_at, updated_at)
      select gen_random_uuid(), ?, ?, 'Bulkmake', 'Model ' || i, case when i = 7 then 'Quillon Rare 777' else 'Fam ' || (i % 50) end, 1000, 2, now(), now()
        from generate_series(1, ${BIKES}) i`, [s, c]);
    await trx.raw(`insert into customer (id, shop_id, name, email, created_at, updated_at)
      select gen_random_uuid(), ?, 'Bulk Rider ' || i, 'rider' || i || '@bulk.test', now() - i * interval '1 minute', now() from generate_series(1, 3000) i`, [s]);
    // Every tenth run has no peak (failed); one run carries a rare tag.
    await trx.raw(`insert into run (id, shop_id, bike_id, sequence, raw_key, raw_sha256, raw_size_bytes, original_name, status, peak_power_hp, peak_torque_lbft,
                                    warnings, tags, note, created_at, updated_at)
      select gen_random_uuid(), b.shop_id, b.id, k, 'k', md5(b.id::text || k), 1, 'bulk-' || k || '.csv',
             case when k = 10 then 'failed' else 'ready' end,
             case when k = 10 then null else 60 + (hashtext(b.id::text || k) % 4000 + 4000) % 4000 / 40.0 end,
             case when k = 10 then null else 70 + (hashtext(k || b.id::text) % 4000 + 4000) % 4000 / 40.0 end,
             '[]', case when b.model = 'Model 11' and k = 3 then array['zephyrtag'] else '{}'::text[] end, null,
             now() - (row_number() over ()) * interval '1 minute', now()
        from bike b cross join generate_series(1, ${RUNS_PER_BIKE}) k where b.shop_id = ? and b.make = 'Bulkmake'`, [s]);
  });
  const conn = t.deps.orm.em.fork().getConnection();
  for (const table of ['bike', 'run', 'stage', 'customer']) await conn.execute(`vacuum analyze ${table}`);
}, 180_000);
afterAll(() => t?.close());

const actorOf = (user: { id: string; customer?: { id: string } | null }, role: Actor['role']): Actor => ({
  id: user.id,
  shopId: shop.shop.id,
  role,
  email: 'x',
  name: 'x',
  customerId: role === 'customer' ? shop.customer.id : null,
});

async function plan(actor: Actor, query: Record<string, string>, countUpTo = 0): Promise<string> {
  const { sql, params } = pageSql(actor, runListQuery.parse(query), countUpTo);
  const rows = (await t.deps.orm.em.fork().getConnection().execute(`explain ${sql}`, params)) as { 'QUERY PLAN': string }[];
  return rows.map((r) => r['QUERY PLAN']).join('\n');
}

const SEQ_SCAN_ON_RUN = /Seq Scan on run /;

describe('query plans (EXPLAIN on 20 000 runs)', () => {
  it('walks the index of each order, never a sequential scan of run', async () => {
    const owner = actorOf(shop.users.owner, 'owner');
    const cases: [Record<string, string>, string | RegExp][] = [
      [{}, 'run_list_created_desc'],
      [{ page: '400' }, 'run_list_created_desc'],
      [{ sort: 'createdAt' }, 'run_list_created_asc'],
      [{ sort: '-peakPowerHp' }, 'run_list_peak_power_hp_desc'],
      [{ sort: 'peakPowerHp' }, 'run_list_peak_power_hp_asc'],
      [{ sort: '-peakTorqueLbft' }, 'run_list_peak_torque_lbft_desc'],
      [{ sort: 'peakTorqueLbft' }, 'run_list_peak_torque_lbft_asc'],
      // Selective filters: their own indexes.
      [{ q: 'quillon rare' }, 'run_search_trgm'],
      [{ q: 'zephyrtag' }, 'run_search_trgm'],
      [{ bikeId: shop.bike.id }, 'Index'],
      [{ status: 'failed' }, 'run_list_status'],
      // A customer's bikes, then their runs from the bike index (never a walk of the whole order index).
      // Either of run's bike-keyed indexes, whichever the planner costs lower.
      [{ customerId: shop.otherBike.customer.id }, /Index Cond: \((\(shop_id = [^)]*\) AND \()?bike_id = ANY/],
    ];
    for (const [query, index] of cases) {
      // As listed, and as a first page that walks up to 201 matches once for rows and count.
      for (const countUpTo of [0, 201]) {
        const p = await plan(owner, query, countUpTo);
        const what = `${JSON.stringify(query)} countUpTo ${countUpTo}\n${p}`;
        if (typeof index === 'string') expect(p, what).toContain(index);
        else expect(p, what).toMatch(index);
        expect(p, what).not.toMatch(SEQ_SCAN_ON_RUN);
      }
    }
  });

  it('seeks to a keyset cursor instead of walking from the start', async () => {
    const owner = await t.signIn(shop.users.owner);
    for (const sort of ['-createdAt', '-peakPowerHp', 'peakTorqueLbft']) {
      const first = await owner.get('/api/runs').query({ sort, pageSize: 25 });
      expect(first.body.nextCursor).toEqual(expect.any(String));
      const p = await plan(actorOf(shop.users.owner, 'owner'), { sort, cursor: first.body.nextCursor });
      expect(p).toMatch(/Index Cond: .*(created_at|coalesce).*[<>]=/i);
      expect(p).not.toMatch(SEQ_SCAN_ON_RUN);
    }
  });

  it('a customer and the bounded count stay on indexes too', async () => {
    const p = await plan(actorOf(shop.users.customer, 'customer'), {});
    expect(p).not.toMatch(SEQ_SCAN_ON_RUN);
    const { sql, params } = totalFromWhere(actorOf(shop.users.owner, 'owner'), runListQuery.parse({ status: 'failed' }));
    // The bounded count of server/db/bounded-total.ts.
    const rows = (await t.deps.orm.em.fork().getConnection().execute(`explain select count(*) from (select 1 ${sql} order by r.created_at desc, r.id limit 201) x`, params)) as { 'QUERY PLAN': string }[];
    const text = rows.map((r) => r['QUERY PLAN']).join('\n');
    expect(text).toContain('run_list_status');
    expect(text).not.toMatch(SEQ_SCAN_ON_RUN);
  });
});

describe('paging and search', () => {
  it('keyset pages give the same rows in the same order as offset pages', async () => {
    const owner = await t.signIn(shop.users.owner);
    for (const sort of ['-createdAt', 'createdAt', '-peakPowerHp', 'peakPowerHp']) {
      const byOffset: string[] = [];
      const byCursor: string[] = [];
      let cursor: string | undefined;
      for (let page = 1; page <= 4; page++) {
        const off = await owner.get('/api/runs').query({ sort, pageSize: 50, page });
        expect(off.status).toBe(200);
        byOffset.push(...off.body.items.map((r: { id: string }) => r.id));
        const key = await owner.get('/api/runs').query({ sort, pageSize: 50, ...(cursor ? { cursor } : {}) });
        expect(key.status).toBe(200);
        byCursor.push(...key.body.items.map((r: { id: string }) => r.id));
        cursor = key.body.nextCursor;
      }
      expect(byCursor).toEqual(byOffset);
      expect(new Set(byCursor).size).toBe(200);
    }
    // Runs without a peak come last in both directions.
    const asc = await owner.get('/api/runs').query({ sort: 'peakPowerHp', status: 'ready', pageSize: 3 });
    const powers = asc.body.items.map((r: { peakPowerHp: number }) => r.peakPowerHp);
    expect(powers.every((p: number | null) => p !== null)).toBe(true);
    expect([...powers].sort((x, y) => x - y)).toEqual(powers);
  });

  it('walks a filtered list to its end with the cursor, then answers nextCursor null', async () => {
    const owner = await t.signIn(shop.users.owner);
    const seen: string[] = [];
    let cursor: string | undefined;
    for (let i = 0; i < 10; i++) {
      const res = await owner.get('/api/runs').query({ bikeId: shop.bike.id, pageSize: 1, ...(cursor ? { cursor } : {}) });
      seen.push(...res.body.items.map((r: { id: string }) => r.id));
      cursor = res.body.nextCursor ?? undefined;
      if (!cursor) break;
    }
    const all = await owner.get('/api/runs').query({ bikeId: shop.bike.id, pageSize: 200 });
    expect(seen).toEqual(all.body.items.map((r: { id: string }) => r.id));
    expect(all.body.nextCursor).toBeNull();
  });

  it('refuses a cursor of another sort or a made-up one', async () => {
    const owner = await t.signIn(shop.users.owner);
    const first = await owner.get('/api/runs').query({ sort: '-createdAt' });
    expect((await owner.get('/api/runs').query({ sort: '-peakPowerHp', cursor: first.body.nextCursor })).status).toBe(400);
    expect((await owner.get('/api/runs').query({ cursor: 'not-a-cursor' })).status).toBe(400);
  });

  it('searches engine family and tags, and follows a renamed bike', async () => {
    const owner = await t.signIn(shop.users.owner);
    const family = await owner.get('/api/runs').query({ q: 'Quillon Rare', pageSize: 50 });
    expect(family.body.items).toHaveLength(RUNS_PER_BIKE);
    expect(family.body.total).toBe(RUNS_PER_BIKE);
    expect(family.body.totalIsEstimate).toBeUndefined();
    const tag = await owner.get('/api/runs').query({ q: 'ZEPHYR' });
    expect(tag.body.items.map((r: { tags: string[] }) => r.tags)).toEqual([['zephyrtag']]);
    // Renaming the bike's engine family re-indexes its runs (trigger on bike).
    const conn = t.deps.orm.em.fork().getConnection();
    await conn.execute(`update bike set engine_family = 'Quillon Moved' where shop_id = ? and engine_family = 'Quillon Rare 777'`, [shop.shop.id]);
    expect((await owner.get('/api/runs').query({ q: 'Quillon Rare' })).body.items).toHaveLength(0);
    expect((await owner.get('/api/runs').query({ q: 'quillon moved' })).body.total).toBe(RUNS_PER_BIKE);
  });

  it('counts exactly up to 200 matches and estimates beyond', async () => {
    const owner = await t.signIn(shop.users.owner);
    const failed = await owner.get('/api/runs').query({ status: 'failed' });
    // 2 000 failed runs are more than the exact bound: an estimate, flagged, of the right size.
    expect(failed.body.totalIsEstimate).toBe(true);
    expect(failed.body.total).toBeGreaterThan(BIKES * 0.5);
    expect(failed.body.total).toBeLessThan(BIKES * 2);
    // 11 bikes (Model 199, 1990–1999) × 10 runs: the first pages count them in the same walk, exactly.
    const [{ n }] = (await t.deps.orm.em.fork().getConnection().execute(`select count(*)::int as n from run where shop_id = ? and search_text ilike '%model 199%'`, [shop.shop.id])) as { n: number }[];
    expect(n).toBe(110);
    for (const page of [1, 2, 5]) {
      const res = (await owner.get('/api/runs').query({ q: 'model 199', page })).body;
      expect(res.total, `page ${page}`).toBe(110);
      expect(res.totalIsEstimate).toBeUndefined();
      expect(res.items).toHaveLength(page === 5 ? 10 : 25);
    }
    const one = await owner.get('/api/runs').query({ bikeId: shop.otherBike.id });
    expect(one.body).toMatchObject({ total: 0, items: [], nextCursor: null });
    expect(one.body.totalIsEstimate).toBeUndefined();
  });
});

/** The SQL statements the ORM sends while `fn` runs (the bikes and customers lists are ORM queries). */
async function statementsOf(fn: () => Promise<unknown>): Promise<{ sql: string; params: unknown[] }[]> {
  const conn = t.deps.orm.em.getConnection();
  const original = conn.execute.bind(conn);
  const seen: { sql: string; params: unknown[] }[] = [];
  conn.execute = ((sql: string, params: unknown[] = [], ...rest: unknown[]) => {
    if (typeof sql === 'string') seen.push({ sql, params });
    return (original as (...a: unknown[]) => unknown)(sql, params, ...rest);
  }) as typeof conn.execute;
  try {
    await fn();
  } finally {
    conn.execute = original;
  }
  return seen;
}

describe('bikes and customers lists (EXPLAIN on 2 000 bikes and 3 000 customers)', () => {
  const owner = () => actorOf(shop.users.owner, 'owner');

  it('reads the first page of each order from its index, without sorting the whole shop', async () => {
    const cases: [() => Promise<unknown>, RegExp, string][] = [
      [() => listBikes(t.deps.orm.em.fork(), owner(), bikeListQuery.parse({ sort: '-createdAt', pageSize: '5' })), /from "bike"/, 'bike_list_created'],
      [() => listBikes(t.deps.orm.em.fork(), owner(), bikeListQuery.parse({ sort: 'make' })), /from "bike"/, 'bike_list_make'],
      [() => listBikes(t.deps.orm.em.fork(), owner(), bikeListQuery.parse({ sort: '-year' })), /from "bike"/, 'bike_list_year'],
      [() => listCustomers(t.deps.orm.em.fork(), owner(), customerListQuery.parse({ sort: '-createdAt', pageSize: '5' })), /from "customer"/, 'customer_list_created'],
      [() => listCustomers(t.deps.orm.em.fork(), owner(), customerListQuery.parse({})), /from "customer"/, 'customer_list_name'],
      [() => listCustomers(t.deps.orm.em.fork(), owner(), customerListQuery.parse({ sort: '-email' })), /from "customer"/, 'customer_list_email'],
    ];
    for (const [run, table, index] of cases) {
      const page = (await statementsOf(run)).find((s) => table.test(s.sql) && /limit/i.test(s.sql) && !/count\(/i.test(s.sql));
      expect(page, `no page query for ${index}`).toBeDefined();
      const rows = (await t.deps.orm.em.fork().getConnection().execute(`explain ${page!.sql}`, page!.params)) as { 'QUERY PLAN': string }[];
      const text = rows.map((r) => r['QUERY PLAN']).join('\n');
      expect(text, text).toContain(index);
      expect(text, text).not.toMatch(/(^|\s)Sort(\s|$)|Sort Key/);
    }
  });

  it('searches bikes through the trigram index of bike.search_text', async () => {
    const statements = await statementsOf(() => listBikes(t.deps.orm.em.fork(), owner(), bikeListQuery.parse({ q: 'quillon' })));
    const page = statements.find((s) => /from "bike"/.test(s.sql) && /search_text/.test(s.sql) && /limit/i.test(s.sql));
    expect(page).toBeDefined();
    // 2 000 bikes fit in a few pages, where reading them all is cheapest; with sequential scans
    // priced out, the plan shows the index serves the search (the old OR across bike and
    // customer could use none, so it read every bike of the shop at any size).
    const text = await t.deps.orm.em.fork().getKnex().transaction(async (trx) => {
      await trx.raw('set local enable_seqscan = off');
      const res = (await trx.raw(`explain ${page!.sql}`, page!.params as never)) as { rows: { 'QUERY PLAN': string }[] };
      return res.rows.map((r) => r['QUERY PLAN']).join('\n');
    });
    expect(text, text).toContain('bike_search_trgm');
  });

  it('counts bikes exactly up to 200 and estimates beyond, saying which', async () => {
    const agent = await t.signIn(shop.users.owner);
    const all = (await agent.get('/api/bikes')).body;
    expect(all.totalIsEstimate).toBe(true);
    // The planner's estimate of 2 000+ bikes: near, not exact (within a quarter here).
    expect(Math.abs(all.total - 2002) / 2002).toBeLessThan(0.25);
    // (An earlier test renamed the rare engine family to "Quillon Moved".)
    const rare = (await agent.get('/api/bikes').query({ q: 'quillon' })).body;
    expect(rare).toMatchObject({ total: 1 });
    expect(rare.totalIsEstimate).toBeUndefined();
    // A deep page still answers its rows, and a total never below what the pages have shown.
    const deep = (await agent.get('/api/bikes').query({ page: 80, pageSize: 25 })).body;
    expect(deep.items).toHaveLength(25);
    expect(deep.total).toBeGreaterThanOrEqual(80 * 25);
  });

  it('counts a bike page’s stage runs and numbers a new pull without a sequential scan of run', async () => {
    // Runs of the 20 000 here have no stage or session; the plans are what matters.
    const agent = await t.signIn(shop.users.owner);
    expect((await agent.post('/api/stages').send({ bikeId: shop.bike.id, name: 'Plan check stage' })).status).toBe(201);
    const stageCounts = await statementsOf(() => listStages(t.deps.orm.em.fork(), owner(), shop.bike.id));
    const sequence = sequenceScope(shop.bike.id, shop.bike.id);
    const queries = [...stageCounts.filter((s) => /from run /.test(s.sql)), { sql: sequence.sql, params: sequence.params }];
    expect(queries.length).toBe(2);
    for (const q of queries) {
      const rows = (await t.deps.orm.em.fork().getConnection().execute(`explain ${q.sql}`, q.params)) as { 'QUERY PLAN': string }[];
      const text = rows.map((r) => r['QUERY PLAN']).join('\n');
      expect(text, `${q.sql}\n${text}`).not.toMatch(SEQ_SCAN_ON_RUN);
    }
  });
});
