import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { median, quantile } from 'simple-statistics';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { HeadWorkLevel, PartCategory } from '@shared/parts';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { Bike } from '@server/modules/bikes/bike.entity';
import { Customer } from '@server/modules/customers/customer.entity';
import { Part, Stage } from '@server/modules/stages/stage.entity';
import { Run } from '@server/modules/runs/run.entity';
import { Shop } from '@server/modules/shops/shop.entity';
import { searchSql } from '@server/modules/builds/build-search.service';
import { SIMILAR_CANDIDATE_BIKES } from '@server/modules/builds/build-similar.service';
import { buildSearchQuery } from '@shared/schemas/builds';
import type { Actor } from '@server/http/actor';

/**
 * Build finder API against the real PostgreSQL. Bikes, stages and parts are inserted directly
 * (the gain columns are set by hand, so the answers are known). Makes and engine families are
 * invented.
 */

let t: TestApp;
let a: TestShop;
let b: TestShop;

interface StageSpec {
  name: string;
  date?: string;
  peak?: number | null;
  avg?: number | null;
  area?: number | null;
  parts?: { category: PartCategory; description: string; level?: HeadWorkLevel; cost?: number }[];
  runs?: { note?: string; tags?: string[] }[];
}

async function addBike(
  em: EntityManager,
  shopId: string,
  customer: Customer,
  spec: { make: string; model: string; family: string | null; cc: number | null; cylinders?: number },
  stages: StageSpec[],
): Promise<{ bike: Bike; stages: Stage[] }> {
  const shop = em.getReference(Shop, shopId);
  const bike = em.create(Bike, { shop, customer, make: spec.make, model: spec.model, engineFamily: spec.family, displacementCc: spec.cc, cylinders: spec.cylinders ?? 2 } as Bike);
  const made: Stage[] = [];
  stages.forEach((s, position) => {
    const stage = em.create(Stage, {
      shop, bike, position, name: s.name, date: s.date ?? null, description: null,
      gainPeakPowerHp: position === 0 ? null : (s.peak ?? null),
      gainAveragePowerHp: position === 0 ? null : (s.avg ?? (s.peak != null ? s.peak * 0.6 : null)),
      gainAreaPct: position === 0 ? null : (s.area ?? (s.peak != null ? s.peak / 2 : null)),
      totalCostCents: (s.parts ?? []).reduce((sum, p) => sum + (p.cost ?? 0), 0),
    } as Stage);
    made.push(stage);
    for (const p of s.parts ?? []) {
      em.create(Part, { shop, stage, category: p.category, description: p.description, headWorkLevel: p.level ?? null, partCostCents: p.cost ?? 0, labourCostCents: 0 } as Part);
    }
    (s.runs ?? []).forEach((r, i) => {
      em.create(Run, {
        shop, bike, stage, sequence: i + 1, rawKey: `k/${randomUUID()}`, rawSha256: randomUUID().replace(/-/g, '').padEnd(64, '0'),
        rawSizeBytes: 10, originalName: 'pull.csv', status: 'ready', warnings: [], tags: r.tags ?? [], note: r.note ?? null, peakPowerHp: 100,
      } as unknown as Run);
    });
  });
  await em.flush();
  return { bike, stages: made };
}

const ids = {} as Record<string, { bike: Bike; stages: Stage[] }>;
let secondCustomer: Customer;

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Finder Alpha');
  b = await t.createShop('Finder Beta');
  const em = t.deps.orm.em.fork();
  const cust = await em.findOneOrFail(Customer, a.customer.id);
  secondCustomer = em.create(Customer, { shop: em.getReference(Shop, a.shop.id), name: 'Second Rider' } as Customer);
  ids.b1 = await addBike(em, a.shop.id, cust, { make: 'Corvane', model: 'Ridgeline', family: 'Vantor 103', cc: 1690 }, [
    { name: 'Baseline', date: '2025-01-10' },
    { name: 'Stage 1', date: '2025-03-01', peak: 8, parts: [{ category: 'exhaust', description: 'Two-into-one header', cost: 90000 }, { category: 'intake', description: 'High-flow air cleaner', cost: 30000 }, { category: 'fuel-tune', description: 'Fuel map on the dyno', cost: 40000 }] },
    { name: 'Stage 2', date: '2025-04-10', peak: 18, parts: [{ category: 'camshaft', description: 'Bolt-in cam set', cost: 120000 }] },
    { name: 'Stage 3', date: '2025-06-01', peak: 27, parts: [{ category: 'cylinder-heads', description: 'Mild port and valve job', level: 'mild-port', cost: 150000 }], runs: [{ note: 'Pinging at 3200 rpm cured with timing', tags: ['customer-approved'] }, { note: 'Second pull' }] },
  ]);
  ids.b2 = await addBike(em, a.shop.id, cust, { make: 'Corvane', model: 'Tourer', family: 'Vantor 107', cc: 1750 }, [
    { name: 'Baseline', date: '2024-02-01' },
    { name: 'Stage 1', date: '2024-03-01', peak: 12, parts: [{ category: 'camshaft', description: 'Chain-drive cams', cost: 100000 }, { category: 'cylinder-heads', description: 'Stock heads, new springs', level: 'stock', cost: 20000 }] },
    { name: 'Stage 2', date: '2024-05-01', peak: 20, parts: [{ category: 'cylinder-heads', description: 'Full port', level: 'full-port', cost: 180000 }] },
  ]);
  ids.b3 = await addBike(em, a.shop.id, secondCustomer, { make: 'Kestrel', model: 'Apex', family: 'Strata Inline-4', cc: 998, cylinders: 4 }, [
    { name: 'Baseline', date: '2025-01-15' },
    { name: 'Stage 1', date: '2025-02-01', peak: 5, parts: [{ category: 'exhaust', description: 'Titanium slip-on', cost: 70000 }] },
  ]);
  // The other shop: the same engine family, which must never show in shop A's answers.
  const custB = await em.findOneOrFail(Customer, b.customer.id);
  ids.b4 = await addBike(em, b.shop.id, custB, { make: 'Corvane', model: 'Ridgeline', family: 'Vantor 103', cc: 1690 }, [
    { name: 'Baseline' },
    { name: 'Stage 1', date: '2025-03-01', peak: 30, parts: [{ category: 'camshaft', description: 'Bolt-in cam set' }, { category: 'cylinder-heads', description: 'Mild port', level: 'mild-port' }] },
  ]);
});
afterAll(() => t.close());

type Item = { bikeId: string; stageId: string; peakPowerGainHp: number; stageName: string; parts: { category: string }[]; reasons?: string[]; similarity?: number };
const stageKey = (i: Item) => `${[...Object.entries(ids)].find(([, v]) => v.bike.id === i.bikeId)?.[0]}/${i.stageName}`;

async function search(query: Record<string, string | number>, as = a.users.owner) {
  const agent = await t.signIn(as);
  const res = await agent.get('/api/builds/search').query(query);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as { items: Item[]; nextCursor: string | null; total: number };
}
const keys = async (query: Record<string, string | number>) => (await search({ limit: 100, sort: 'gain', ...query })).items.map(stageKey).sort();

describe('build search filters (known answers)', () => {
  it('lists every measured stage of the shop and no baseline', async () => {
    expect(await keys({})).toEqual(['b1/Stage 1', 'b1/Stage 2', 'b1/Stage 3', 'b2/Stage 1', 'b2/Stage 2', 'b3/Stage 1']);
  });

  it('matches the engine family fuzzily and ranks the closer spelling first', async () => {
    const res = await search({ engine: 'vantor 103', sort: 'similarity', limit: 100 });
    const order = res.items.map(stageKey);
    // "Vantor 107" shares 9 of the 11 trigrams of "vantor 103" (word similarity ≈ 0.82 ≥ 0.6).
    expect(order.slice(0, 3).sort()).toEqual(['b1/Stage 1', 'b1/Stage 2', 'b1/Stage 3']);
    expect(order.slice(3).sort()).toEqual(['b2/Stage 1', 'b2/Stage 2']);
    expect(await keys({ engine: 'strata' })).toEqual(['b3/Stage 1']);
    expect(await keys({ engine: 'vantr 103' })).toContain('b1/Stage 3'); // a typo still finds it
  });

  it('filters by displacement in cm³ and in cubic inches (1 in³ = 16.387064 cm³, NIST SP 811)', async () => {
    expect(await keys({ ccMin: 1700 })).toEqual(['b2/Stage 1', 'b2/Stage 2']);
    expect(await keys({ ccMax: 1000 })).toEqual(['b3/Stage 1']);
    // 100–105 in³ = 1638.7–1720.6 cm³: only the 1690 cm³ bike.
    expect(await keys({ ciMin: 100, ciMax: 105 })).toEqual(['b1/Stage 1', 'b1/Stage 2', 'b1/Stage 3']);
    // 1690 cm³ = 103.13 in³: a bound just above excludes it.
    expect(await keys({ ciMin: 103.2, ciMax: 105 })).toEqual([]);
  });

  it('filters by make, model, cylinders and customer', async () => {
    expect(await keys({ make: 'kest' })).toEqual(['b3/Stage 1']);
    expect(await keys({ model: 'tour' })).toEqual(['b2/Stage 1', 'b2/Stage 2']);
    expect(await keys({ cylinders: 4 })).toEqual(['b3/Stage 1']);
    expect(await keys({ customerId: secondCustomer.id })).toEqual(['b3/Stage 1']);
  });

  it('requires every listed part category in the cumulative build, heads at a minimum level', async () => {
    expect(await keys({ parts: 'camshaft,cylinder-heads' })).toEqual(['b1/Stage 3', 'b2/Stage 1', 'b2/Stage 2']);
    // Mild port or better: b2's stock heads at Stage 1 do not count, its full port at Stage 2 does.
    expect(await keys({ parts: 'camshaft', headLevel: 'mild-port' })).toEqual(['b1/Stage 3', 'b2/Stage 2']);
    expect(await keys({ headLevel: 'full-port' })).toEqual(['b2/Stage 2']);
    expect(await keys({ parts: 'exhaust' })).toEqual(['b1/Stage 1', 'b1/Stage 2', 'b1/Stage 3', 'b3/Stage 1']);
    const res = await search({ parts: 'camshaft', headLevel: 'mild-port', sort: 'gain' });
    expect(res.items[0].parts.map((p) => p.category).sort()).toEqual(['camshaft', 'cylinder-heads', 'exhaust', 'fuel-tune', 'intake']);
  });

  it('searches part text, free text over notes and parts, tags and dates', async () => {
    expect(await keys({ partText: 'slip-on' })).toEqual(['b3/Stage 1']);
    expect(await keys({ q: 'pinging' })).toEqual(['b1/Stage 3']); // a run note
    expect(await keys({ q: 'valve' })).toEqual(['b1/Stage 3']); // a part of that stage
    expect(await keys({ q: 'header' })).toEqual(['b1/Stage 1', 'b1/Stage 2', 'b1/Stage 3']); // cumulative parts
    expect(await keys({ q: 'ported' })).toEqual(['b1/Stage 3', 'b2/Stage 2']); // English stemming: ported → port
    expect(await keys({ tag: 'customer-approved' })).toEqual(['b1/Stage 3']);
    expect(await keys({ from: '2025-04-01', to: '2025-05-01' })).toEqual(['b1/Stage 2']);
    expect(await keys({ from: '2025-01-01' })).toEqual(['b1/Stage 1', 'b1/Stage 2', 'b1/Stage 3', 'b3/Stage 1']);
  });

  it('pages by keyset cursor in gain order without gaps or repeats', async () => {
    const seen: number[] = [];
    let cursor: string | null = null;
    let pages = 0;
    do {
      const res = await search({ sort: 'gain', limit: 2, ...(cursor ? { cursor } : {}) });
      seen.push(...res.items.map((i) => i.peakPowerGainHp));
      // Every page counts all six matching builds, not just its own rows.
      expect(res.total).toBe(6);
      cursor = res.nextCursor;
      pages += 1;
    } while (cursor && pages < 10);
    expect(seen).toEqual([27, 20, 18, 12, 8, 5]);
    expect(pages).toBe(3);
    const bad = await (await t.signIn(a.users.owner)).get('/api/builds/search').query({ cursor: 'not-a-cursor' });
    expect(bad.status).toBe(400);
  });

  it('pages in similarity and date order too', async () => {
    for (const sort of ['similarity', 'date'] as const) {
      const all = (await search({ engine: 'vantor', sort, limit: 100 })).items.map((i) => i.stageId);
      const paged: string[] = [];
      let cursor: string | null = null;
      do {
        const res = await search({ engine: 'vantor', sort, limit: 2, ...(cursor ? { cursor } : {}) });
        paged.push(...res.items.map((i) => i.stageId));
        cursor = res.nextCursor;
      } while (cursor && paged.length < 50);
      expect(paged).toEqual(all);
      expect(all.length).toBe(5);
    }
  });

  it('rejects an unknown part category', async () => {
    const agent = await t.signIn(a.users.owner);
    expect((await agent.get('/api/builds/search').query({ parts: 'rocket' })).status).toBe(400);
  });
});

describe('roles and shops', () => {
  it('answers 403 to customers on every finder route', async () => {
    const customer = await t.signIn(a.users.customer);
    expect((await customer.get('/api/builds/search')).status).toBe(403);
    expect((await customer.get(`/api/bikes/${ids.b1.bike.id}/similar`)).status).toBe(403);
    expect((await customer.get('/api/builds/typical').query({ bikeId: ids.b1.bike.id, category: 'camshaft' })).status).toBe(403);
  });

  it('lets tuner and desk search', async () => {
    expect((await search({}, a.users.tuner)).items.length).toBe(6);
    expect((await search({}, a.users.desk)).items.length).toBe(6);
  });

  it('never crosses shops', async () => {
    const fromB = await search({ engine: 'vantor 103' }, b.users.owner);
    expect(fromB.items.map((i) => i.bikeId)).toEqual([ids.b4.bike.id]);
    const fromA = await search({ engine: 'vantor 103', limit: 100 });
    expect(fromA.items.some((i) => i.bikeId === ids.b4.bike.id)).toBe(false);
    const ownerB = await t.signIn(b.users.owner);
    expect((await ownerB.get(`/api/bikes/${ids.b1.bike.id}/similar`)).status).toBe(404);
    expect((await ownerB.get('/api/builds/typical').query({ bikeId: ids.b1.bike.id, category: 'camshaft' })).status).toBe(404);
    const similarB = await ownerB.get(`/api/bikes/${ids.b4.bike.id}/similar`);
    expect(similarB.status).toBe(200);
    expect(similarB.body.items).toEqual([]); // shop B has no other bike with builds
  });

  it('answers 404 for an unknown bike', async () => {
    const owner = await t.signIn(a.users.owner);
    expect((await owner.get(`/api/bikes/${randomUUID()}/similar`)).status).toBe(404);
  });
});

describe('similar builds', () => {
  it('ranks a hand-made set by the documented weights and says why', async () => {
    const shop = await t.createShop('Finder Gamma');
    const em = t.deps.orm.em.fork();
    const cust = await em.findOneOrFail(Customer, shop.customer.id);
    const mine = await addBike(em, shop.shop.id, cust, { make: 'Corvane', model: 'Mine', family: 'Vantor 103', cc: 1700 }, [
      { name: 'Baseline' },
      { name: 'Stage 1', peak: 10, parts: [{ category: 'exhaust', description: 'Two-into-one header' }, { category: 'camshaft', description: 'Bolt-in cam set' }] },
    ]);
    const c1 = await addBike(em, shop.shop.id, cust, { make: 'Corvane', model: 'Twin', family: 'Vantor 103', cc: 1700 }, [
      { name: 'Baseline' },
      { name: 'Stage 1', peak: 11, parts: [{ category: 'exhaust', description: 'Two-into-one header' }, { category: 'camshaft', description: 'Bolt-in cam set' }] },
    ]);
    const c2 = await addBike(em, shop.shop.id, cust, { make: 'Corvane', model: 'NoParts', family: 'Vantor 103', cc: 1700 }, [
      { name: 'Baseline' },
      { name: 'Stage 1', peak: 4, parts: [{ category: 'ignition', description: 'Coil pack' }] },
    ]);
    const c3 = await addBike(em, shop.shop.id, cust, { make: 'Corvane', model: 'Bigger', family: 'Vantor 103', cc: 1955 }, [
      { name: 'Baseline' },
      { name: 'Stage 1', peak: 6, parts: [{ category: 'ignition', description: 'Coil pack' }] },
    ]);
    const c4 = await addBike(em, shop.shop.id, cust, { make: 'Kestrel', model: 'Same size', family: 'Strata Inline-4', cc: 1700, cylinders: 4 }, [
      { name: 'Baseline' },
      { name: 'Stage 1', peak: 9, parts: [{ category: 'ignition', description: 'Coil pack' }] },
    ]);
    const c5 = await addBike(em, shop.shop.id, cust, { make: 'Kestrel', model: 'Small', family: 'Strata Inline-4', cc: 600, cylinders: 4 }, [
      { name: 'Baseline' },
      { name: 'Stage 1', peak: 3, parts: [{ category: 'exhaust', description: 'Two-into-one header' }] },
    ]);
    const owner = await t.signIn(shop.users.owner);
    const res = await owner.get(`/api/bikes/${mine.bike.id}/similar`);
    expect(res.status).toBe(200);
    const items = res.body.items as (Item & { components: Record<string, number> })[];
    expect(items.map((i) => i.bikeId)).toEqual([c1.bike.id, c2.bike.id, c3.bike.id, c4.bike.id]);
    expect(items.some((i) => i.bikeId === c5.bike.id || i.bikeId === mine.bike.id)).toBe(false);
    // c3: same family (E = 1), 15 % larger → D = 1 − 0.15/0.20 = 0.25, no shared parts, so 0.4 + 0.3·0.25.
    expect(items[2].components.displacement).toBeCloseTo(0.25, 9);
    expect(items[2].similarity).toBeCloseTo(0.4 * 1 + 0.3 * 0.25 + 0.1 * items[2].components.partsText, 9);
    // c2: same family and size, nothing shared: 0.4 + 0.3.
    expect(items[1].components.partCategories).toBe(0);
    expect(items[1].similarity).toBeCloseTo(0.7 + 0.1 * items[1].components.partsText, 9);
    // c1: identical build → Jaccard 1 and identical text (trigram similarity 1): similarity 1.
    expect(items[0].similarity).toBeCloseTo(1, 9);
    expect(items[0].reasons).toEqual(['same engine family', 'within 5 % displacement', 'same cylinder count', 'also has: camshaft, exhaust', 'similar parts descriptions']);
    expect(items[2].reasons).toContain('within 20 % displacement');
    expect(items[3].reasons).not.toContain('same engine family');
    expect(items[3].reasons).toContain('within 5 % displacement');
  });
});

describe('similar builds against a plain reference query', () => {
  // The service computes T from the trigram sets stored in build_index; this reference scores
  // every candidate build with the documented formula and pg_trgm's own similarity() (which
  // returns single precision, hence 6 digits); both must give the same top list for every limit.
  const REFERENCE = `
    with me as (
      select b.id, b.shop_id, b.engine_family as fam, b.displacement_cc as cc, coalesce(l.categories, '{}') as cats, coalesce(l.parts_text, '') as txt
        from bike b left join lateral (select categories, parts_text from build_index where bike_id = b.id order by stage_position desc limit 1) l on true
       where b.id = ?),
    scored as (
      select bi.stage_id,
             case when me.fam is null or b.engine_family is null then 0 else similarity(b.engine_family, me.fam) end::float8 as e,
             case when me.cc is null or b.displacement_cc is null then 0 else greatest(0, 1 - abs(b.displacement_cc - me.cc) / (0.2 * me.cc)) end::float8 as d,
             coalesce(cardinality(array(select unnest(bi.categories) intersect select unnest(me.cats)))::float8
                      / nullif(cardinality(array(select unnest(bi.categories) union select unnest(me.cats))), 0), 0) as c,
             case when bi.parts_text = '' or me.txt = '' then 0 else similarity(bi.parts_text, me.txt) end::float8 as t
        from build_index bi join bike b on b.id = bi.bike_id cross join me
       where bi.shop_id = me.shop_id and b.id <> me.id and bi.gain_peak_power_hp is not null
         and ((me.fam is not null and b.engine_family % me.fam) or (me.cc is not null and b.displacement_cc between me.cc * 0.8 and me.cc * 1.2)))
    select stage_id, ((0.4 * e + 0.3 * d + 0.2 * c) + 0.1 * t)::float8 as similarity from scored
     order by similarity desc, stage_id desc limit ?`;

  it('gives the same builds in the same order as scoring every candidate (30 generated bikes, limits 1–50)', async () => {
    const shop = await t.createShop('Finder Reference');
    const em = t.deps.orm.em.fork();
    const cust = await em.findOneOrFail(Customer, shop.customer.id);
    // Invented specs from a fixed-seed generator (mulberry32), so the set is the same every run.
    let seed = 20261202;
    const rand = () => {
      seed = (seed + 0x6d2b79f5) | 0;
      let x = Math.imul(seed ^ (seed >>> 15), 1 | seed);
      x = (x + Math.imul(x ^ (x >>> 7), 61 | x)) ^ x;
      return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
    };
    const pick = <T,>(xs: readonly T[]) => xs[Math.floor(rand() * xs.length)];
    const families = ['Vantor 103', 'Vantor 107', 'Vantor 114', 'Strata Inline-4', 'Strata Twin', null];
    const pool: { category: PartCategory; description: string }[] = [
      { category: 'exhaust', description: 'Two-into-one header' },
      { category: 'exhaust', description: 'Slip-on mufflers with removable baffles' },
      { category: 'intake', description: 'High-flow air cleaner' },
      { category: 'camshaft', description: 'Bolt-in cam set' },
      { category: 'camshaft', description: 'Chain-drive cams, adjustable pushrods, new lifters and cam plate' },
      { category: 'cylinder-heads', description: 'Mild port and valve job' },
      { category: 'fuel-tune', description: 'Fuel map on the dyno' },
      { category: 'ignition', description: 'Coil pack' },
    ];
    const bikes: Bike[] = [];
    for (let i = 0; i < 30; i++) {
      const stages: StageSpec[] = [{ name: 'Baseline' }];
      const n = 1 + Math.floor(rand() * 3);
      for (let k = 1; k <= n; k++) {
        const parts = Array.from({ length: Math.floor(rand() * 3) }, () => pick(pool));
        stages.push({ name: `Stage ${k}`, peak: Math.round(rand() * 200) / 10, parts });
      }
      const cc = rand() < 0.1 ? null : 1500 + Math.round(rand() * 400);
      bikes.push((await addBike(em, shop.shop.id, cust, { make: 'Corvane', model: `Ref ${i}`, family: pick(families), cc }, stages)).bike);
    }
    const owner = await t.signIn(shop.users.owner);
    let compared = 0;
    for (const bike of bikes.slice(0, 8)) {
      for (const limit of [1, 3, 10, 50]) {
        const res = await owner.get(`/api/bikes/${bike.id}/similar`).query({ limit });
        expect(res.status).toBe(200);
        const ref = await em.getConnection().execute<{ stage_id: string; similarity: number }[]>(REFERENCE, [bike.id, limit]);
        const got = res.body.items as { stageId: string; similarity: number }[];
        expect(got.map((x) => x.stageId)).toEqual(ref.map((r) => r.stage_id));
        got.forEach((x, i) => expect(x.similarity).toBeCloseTo(ref[i].similarity, 6));
        compared += ref.length;
      }
    }
    // The generated set must give long lists to compare.
    expect(compared).toBeGreaterThan(200);
  });

  it(`scores only the ${SIMILAR_CANDIDATE_BIKES} most recently added of the bikes tied on engine and size (the documented pre-rank)`, async () => {
    const shop = await t.createShop('Finder Ties');
    const em = t.deps.orm.em.fork();
    const cust = await em.findOneOrFail(Customer, shop.customer.id);
    const sh = em.getReference(Shop, shop.shop.id);
    const build = [{ category: 'exhaust' as const, description: 'Two-into-one header' }, { category: 'camshaft' as const, description: 'Bolt-in cam set' }];
    const mine = await addBike(em, shop.shop.id, cust, { make: 'Corvane', model: 'Mine', family: 'Vantor 103', cc: 1700 }, [{ name: 'Baseline' }, { name: 'Stage 1', peak: 10, parts: build }]);
    // More tied bikes than the pre-rank keeps, one measured stage each, inserted in one flush. The
    // oldest few carry this bike's very parts (they would score 1.0); the rest an unrelated part.
    const extra = 5;
    const start = Date.UTC(2024, 0, 1);
    const tied: { bike: Bike; perfect: boolean }[] = [];
    for (let i = 0; i < SIMILAR_CANDIDATE_BIKES + extra; i++) {
      const bike = em.create(Bike, { shop: sh, customer: cust, make: 'Corvane', model: `Tie ${i}`, engineFamily: 'Vantor 103', displacementCc: 1700, cylinders: 2, createdAt: new Date(start + i * 60_000) } as Bike);
      const perfect = i < extra;
      em.create(Stage, { shop: sh, bike, position: 0, name: 'Baseline', date: null, description: null, totalCostCents: 0 } as unknown as Stage);
      const stage = em.create(Stage, { shop: sh, bike, position: 1, name: 'Stage 1', date: null, description: null, gainPeakPowerHp: 5, gainAveragePowerHp: 3, gainAreaPct: 2, totalCostCents: 0 } as unknown as Stage);
      for (const p of perfect ? build : [{ category: 'ignition' as const, description: 'Coil pack' }]) {
        em.create(Part, { shop: sh, stage, category: p.category, description: p.description, headWorkLevel: null, partCostCents: 0, labourCostCents: 0 } as Part);
      }
      tied.push({ bike, perfect });
    }
    await em.flush();
    const owner = await t.signIn(shop.users.owner);
    const res = await owner.get(`/api/bikes/${mine.bike.id}/similar`).query({ limit: 50 });
    expect(res.status).toBe(200);
    const got = new Set((res.body.items as { bikeId: string }[]).map((i) => i.bikeId));
    expect(got.size).toBe(50);
    // The oldest (perfect) bikes fall outside the pre-rank; every answer is one of the newest.
    for (const x of tied.slice(0, extra)) expect(got.has(x.bike.id)).toBe(false);
    const newest = new Set(tied.slice(extra).map((x) => x.bike.id));
    expect([...got].every((id) => newest.has(id))).toBe(true);
  });

  it('stored trigram sets give pg_trgm similarity() for awkward texts (case, punctuation, "0x", multibyte, empty)', async () => {
    const texts = ['Mild port and valve job', 'MILD PORT, valve-job!', '0xa1 header 0x', 'Über-Straße ÄÖ 12', 'uber strasse äö 12 日本', '日本語のテキスト', '---', '', 'a', 'Two-into-one header'];
    const rows = await t.deps.orm.em.getConnection().execute<{ a: string; b: string; pg: number; ours: number }[]>(
      `select x.t as a, y.t as b, similarity(x.t, y.t)::float8 as pg,
              coalesce(icount(trgm_codes(x.t) & trgm_codes(y.t))::float8
                       / nullif(icount(trgm_codes(x.t)) + icount(trgm_codes(y.t)) - icount(trgm_codes(x.t) & trgm_codes(y.t)), 0), 0) as ours
         from unnest(?::text[]) x(t), unnest(?::text[]) y(t)`,
      [`{${texts.map((x) => JSON.stringify(x)).join(',')}}`, `{${texts.map((x) => JSON.stringify(x)).join(',')}}`],
    );
    expect(rows).toHaveLength(texts.length ** 2);
    for (const r of rows) expect({ a: r.a, b: r.b, v: r.ours }).toEqual({ a: r.a, b: r.b, v: expect.closeTo(r.pg, 6) });
    // Not all zero: the set has real overlaps.
    expect(rows.filter((r) => r.a !== r.b && r.pg > 0.3).length).toBeGreaterThan(2);
  });
});

describe('typical outcome', () => {
  it('summarises per-stage increments of similar builds (checked with simple-statistics, R-7 quantiles)', async () => {
    const shop = await t.createShop('Finder Delta');
    const em = t.deps.orm.em.fork();
    const cust = await em.findOneOrFail(Customer, shop.customer.id);
    const planned = await addBike(em, shop.shop.id, cust, { make: 'Corvane', model: 'Planned', family: 'Vantor 103', cc: 1690 }, [{ name: 'Baseline' }]);
    // [gain after stage 1 (exhaust), gain after stage 2 (mild port heads), cost of the heads]
    const similar: [number, number, number][] = [
      [8, 17.5, 60000], [7, 13, 45000], [9.5, 21, 80000], [6, 16.2, 30000], [8.8, 14.1, 55000], [7.7, 25.3, 72000],
    ];
    for (const [i, [g1, g2, cost]] of similar.entries()) {
      await addBike(em, shop.shop.id, cust, { make: 'Corvane', model: `S${i}`, family: 'Vantor 103', cc: 1650 + i * 15 }, [
        { name: 'Baseline' },
        { name: 'Stage 1', peak: g1, avg: g1 / 2, parts: [{ category: 'exhaust', description: 'Slip-ons', cost: 50000 }] },
        { name: 'Stage 2', peak: g2, avg: g2 / 2, parts: [{ category: 'cylinder-heads', description: 'Mild port', level: 'mild-port', cost }] },
      ]);
    }
    // Heads added straight after the baseline: the increment is the whole gain.
    await addBike(em, shop.shop.id, cust, { make: 'Corvane', model: 'Direct', family: 'Vantor 103', cc: 1700 }, [
      { name: 'Baseline' },
      { name: 'Heads', peak: 11, avg: 5.5, parts: [{ category: 'cylinder-heads', description: 'Mild port', level: 'mild-port', cost: 65000 }] },
    ]);
    // Not counted: a full port (other level), a dissimilar engine, a heads stage never measured.
    await addBike(em, shop.shop.id, cust, { make: 'Corvane', model: 'Full', family: 'Vantor 103', cc: 1690 }, [
      { name: 'Baseline' }, { name: 'Heads', peak: 40, parts: [{ category: 'cylinder-heads', description: 'Full port', level: 'full-port' }] },
    ]);
    await addBike(em, shop.shop.id, cust, { make: 'Kestrel', model: 'Four', family: 'Strata Inline-4', cc: 998, cylinders: 4 }, [
      { name: 'Baseline' }, { name: 'Heads', peak: 12, parts: [{ category: 'cylinder-heads', description: 'Mild port', level: 'mild-port' }] },
    ]);
    await addBike(em, shop.shop.id, cust, { make: 'Corvane', model: 'Unmeasured', family: 'Vantor 103', cc: 1690 }, [
      { name: 'Baseline' }, { name: 'Heads', peak: null, parts: [{ category: 'cylinder-heads', description: 'Mild port', level: 'mild-port' }] },
      { name: 'Later', peak: 30, parts: [{ category: 'cylinder-heads', description: 'Mild port again', level: 'mild-port' }] },
    ]);

    const owner = await t.signIn(shop.users.desk);
    const res = await owner.get('/api/builds/typical').query({ bikeId: planned.bike.id, category: 'cylinder-heads', level: 'mild-port' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const inc = [...similar.map(([g1, g2]) => g2 - g1), 11];
    const costs = [...similar.map(([, , c]) => c), 65000];
    expect(res.body.count).toBe(7);
    expect(res.body.lowConfidence).toBe(false);
    // simple-statistics' quantile is type 7 (its source: "(n-1) * p … matching numpy's linear method").
    expect(res.body.peakPowerGainHp.median).toBeCloseTo(median(inc), 9);
    expect(res.body.peakPowerGainHp.q1).toBeCloseTo(quantile(inc, 0.25), 9);
    expect(res.body.peakPowerGainHp.q3).toBeCloseTo(quantile(inc, 0.75), 9);
    expect(res.body.peakPowerGainHp.min).toBeCloseTo(Math.min(...inc), 9);
    expect(res.body.peakPowerGainHp.max).toBeCloseTo(Math.max(...inc), 9);
    const avgInc = inc.map((x) => x / 2);
    expect(res.body.averagePowerGainHp.median).toBeCloseTo(median(avgInc), 9);
    expect(res.body.averagePowerGainHp.q1).toBeCloseTo(quantile(avgInc, 0.25), 9);
    expect(res.body.averagePowerGainHp.q3).toBeCloseTo(quantile(avgInc, 0.75), 9);
    expect(res.body.costCents).toEqual({ min: Math.min(...costs), median: median(costs), max: Math.max(...costs) });
    expect(res.body.disclaimer).toMatch(/not a promise/);
    expect(res.body.quantileMethod).toMatch(/type 7/);

    const few = await owner.get('/api/builds/typical').query({ bikeId: planned.bike.id, category: 'cylinder-heads', level: 'full-port' });
    expect(few.body.count).toBe(1);
    expect(few.body.lowConfidence).toBe(true);
    expect(few.body.message).toMatch(/^Only 1 similar build/);
    const none = await owner.get('/api/builds/typical').query({ bikeId: planned.bike.id, category: 'big-bore' });
    expect(none.body.count).toBe(0);
    expect(none.body.peakPowerGainHp).toBeNull();
    expect(none.body.lowConfidence).toBe(true);
  });
});

describe('indexes (EXPLAIN on 20 000 bikes)', () => {
  it('uses the trigram index for the engine filter and the full-text index for q', { timeout: 120_000 }, async () => {
    const shop = await t.createShop('Finder Bulk');
    const conn = t.deps.orm.em.fork().getConnection();
    const s = shop.shop.id;
    const c = shop.customer.id;
    // One transaction with the build_index triggers deferred, then one refresh of the shop's bikes
    // (as server/cli/seed-large.ts loads in bulk); otherwise each insert statement would rebuild every bike's rows again.
    await t.deps.orm.em.fork().getKnex().transaction(async (trx) => {
      await trx.raw(`select set_config('pullbook.build_index_deferred', 'on', true)`);
      await trx.raw(`insert into bike (id, shop_id, customer_id, make, model, engine_family, displacement_cc, cylinders, created_at, updated_at)
        select gen_random_uuid(), ?, ?, 'Make' || (i % 40), 'Model ' || md5(i::text), substr(md5(i::text), 1, 12), 900 + (i % 900), 2, now(), now()
          from generate_series(1, 20000) i`, [s, c]);
      await trx.raw(`insert into stage (id, shop_id, bike_id, position, name, description, gain_peak_power_hp, total_cost_cents, created_at)
        select gen_random_uuid(), b.shop_id, b.id, k, 'Stage ' || k, case when k = 2 and b.model like 'Model 0%' then 'detonation fixed' else 'routine step' end,
               case when k = 0 then null else k * 5 end, 1000, now()
          from bike b, generate_series(0, 2) k where b.shop_id = ?`, [s]);
      await trx.raw(`insert into part (id, shop_id, stage_id, category, description, part_cost_cents, labour_cost_cents, created_at)
        select gen_random_uuid(), st.shop_id, st.id, 'exhaust', 'Pipe ' || md5(st.id::text), 1000, 0, now() from stage st where st.shop_id = ? and st.position = 1`, [s]);
      await trx.raw(`insert into run (id, shop_id, bike_id, stage_id, sequence, raw_key, raw_sha256, raw_size_bytes, original_name, status, warnings, tags, note, created_at, updated_at)
        select gen_random_uuid(), st.shop_id, st.bike_id, st.id, 1, 'k', md5(st.id::text), 1, 'x.csv', 'ready', '[]', '{}', 'pull ' || md5(st.id::text), now(), now()
          from stage st where st.shop_id = ?`, [s]);
      await trx.raw(`select set_config('pullbook.build_index_deferred', 'off', true)`);
      // Fresh statistics first: the refresh joins the new rows stage by stage.
      await trx.raw(`analyze bike, stage, part, run`);
      await trx.raw(`select build_index_refresh(array(select id from bike where shop_id = ?))`, [s]);
    });
    // VACUUM also merges the GIN pending lists of the bulk insert, as autovacuum would.
    for (const table of ['bike', 'stage', 'part', 'run', 'build_index', 'build_family']) await conn.execute(`vacuum analyze ${table}`);

    const actor: Actor = { id: shop.users.owner.id, shopId: s, role: 'owner', email: 'x', name: 'x', customerId: null };
    const plan = async (query: Record<string, string>) => {
      const { sql, params } = searchSql(actor, buildSearchQuery.parse(query));
      const rows = (await conn.execute(`explain ${sql}`, params)) as { 'QUERY PLAN': string }[];
      return rows.map((r) => r['QUERY PLAN']).join('\n');
    };
    // Selective on purpose: a family shared by a handful of bikes is where the index pays; for a
    // family half the shop shares, a sequential scan is the planner's right answer.
    const [{ family }] = (await conn.execute(`select substr(md5('777'), 1, 12) as family`)) as { family: string }[];
    const enginePlan = await plan({ engine: family });
    expect(enginePlan, enginePlan).toContain('build_family_engine_family_trgm');
    // One run note in 60 000 (each note carries its stage's md5): the GIN index, not a walk in gain order.
    const [{ word }] = (await conn.execute(`select md5(id::text) as word from stage where shop_id = ? and position = 2 limit 1`, [s])) as { word: string }[];
    const textPlan = await plan({ q: word });
    expect(textPlan, textPlan).toContain('build_index_search_tsv');
    const found = await search({ q: word, limit: 100 }, shop.users.owner);
    expect(found.items.length).toBe(1);
  });
});
