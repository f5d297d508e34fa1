/**
 * `npm run seed:large` — fills a SEPARATE database with synthetic builds at archive scale:
 * 10 000 bikes and 100 000 runs across four shops (invented makes and engine families), for the
 * build finder's bench and EXPLAIN checks. Never touches the demo database.
 *
 *   npm run seed:large [-- --url postgres://…/pullbook_large] [--bikes 10000]
 *
 * Target: DATABASE_URL_LARGE, else postgres://pullbook@127.0.0.1:55432/pullbook_large (the
 * `npm start` cluster's server, a database of its own). The database is created and migrated if
 * needed; earlier seeded shops ("Large Seed Shop …") are removed first, so a re-run starts clean.
 *
 * Everything is bulk SQL (INSERT … SELECT over generate_series) in one transaction; the ORM is
 * used only to migrate. Runs carry real summary columns (peak power/torque and their rpm) but no
 * curve; stages carry their gain columns and cost, as refreshBikeOutcomes would have left them, and
 * the finder's build_index is rebuilt once for the seeded bikes (its triggers are deferred meanwhile).
 * Sign in as owner1@large.test … owner4@large.test with the password LARGE_SEED_PASSWORD.
 */
import pg from 'pg';
import { pathToFileURL } from 'node:url';
import { initOrm, migrateToLatest } from '../db/orm';
import { hashPassword } from '../modules/auth/auth.service';

export const DEFAULT_LARGE_URL = 'postgres://pullbook@127.0.0.1:55432/pullbook_large';
export const LARGE_SEED_PASSWORD = 'large-seed-password';
export const LARGE_SEED_SHOPS = 4;

/** Row triggers that keep run.search_text; the seed writes the column itself. */
const SEARCH_TRIGGERS = [['run', 'run_search_text_fill'], ['bike', 'run_search_text_bike'], ['customer', 'run_search_text_customer'], ['stage', 'run_search_text_stage']] as const;

/** Invented engines: family, make, model stem, base cm³, cylinders, stock peak hp at the wheel. */
const ENGINES: [string, string, string, number, number, number][] = [
  ['Vantor 88', 'Corvane', 'Ridgeline', 1450, 2, 62],
  ['Vantor 96', 'Corvane', 'Tourer', 1584, 2, 68],
  ['Vantor 103', 'Corvane', 'Grandline', 1690, 2, 74],
  ['Vantor 107', 'Corvane', 'Plains', 1753, 2, 79],
  ['Vantor 114', 'Corvane', 'Longhaul', 1868, 2, 86],
  ['Kestrel V2 1250', 'Kestrel', 'Apex', 1250, 2, 105],
  ['Ridgeback 1800', 'Ridgeback', 'Nomad', 1800, 2, 82],
  ['Hollis Triple 900', 'Hollis', 'Street', 900, 3, 98],
  ['Strata Inline-4 1000', 'Strata', 'Arrow', 998, 4, 165],
  ['Strata Inline-4 600', 'Strata', 'Dart', 599, 4, 105],
  ['Marlin Boxer 1200', 'Marlin', 'Gran', 1170, 2, 112],
  ['Tallon V4 1100', 'Tallon', 'Vee', 1103, 4, 180],
];

const arr = (values: (string | number)[]) => `array[${values.map((v) => (typeof v === 'number' ? String(v) : `'${v.replace(/'/g, "''")}'`)).join(',')}]`;

export interface SeedLargeResult {
  shops: number;
  bikes: number;
  stages: number;
  parts: number;
  runs: number;
  sessions: number;
  comparisons: number;
  reports: number;
  auditEntries: number;
  ms: number;
}

async function ensureDatabase(url: string) {
  const u = new URL(url);
  const name = decodeURIComponent(u.pathname.replace(/^\//, ''));
  const admin = new pg.Client({ connectionString: url.replace(/\/[^/?]+(\?.*)?$/, '/postgres') });
  await admin.connect();
  try {
    const { rowCount } = await admin.query('select 1 from pg_database where datname = $1', [name]);
    if (!rowCount) await admin.query(`create database "${name.replace(/"/g, '""')}"`);
  } finally {
    await admin.end();
  }
}

export async function seedLarge(url: string, opts: { bikes?: number; log?: (s: string) => void } = {}): Promise<SeedLargeResult> {
  const bikes = opts.bikes ?? 10_000;
  const log = opts.log ?? (() => undefined);
  const t0 = Date.now();
  await ensureDatabase(url);
  const orm = await initOrm(url, { poolMax: 2 });
  try {
    await migrateToLatest(orm);
  } finally {
    await orm.close();
  }
  const hash = await hashPassword(LARGE_SEED_PASSWORD, 10);
  const db = new pg.Client({ connectionString: url });
  await db.connect();
  const q = async (label: string, sql: string, params: unknown[] = []) => {
    const t = Date.now();
    const res = await db.query(sql, params);
    log(`  ${label}: ${res.rowCount ?? 0} rows, ${Date.now() - t} ms`);
    return res;
  };
  const E = (i: number) => arr(ENGINES.map((e) => e[i] as string | number));
  const n = ENGINES.length;
  try {
    await db.query('begin');
    // The build_index triggers wait; one refresh of the seeded bikes at the end does their work once.
    await db.query(`select set_config('pullbook.build_index_deferred', 'on', true)`);
    // The run list's search-text triggers (Migration20261202170000) wait too: the runs insert
    // writes search_text itself, in bulk. ALTER TABLE inside the transaction: a rollback restores them.
    for (const [table, trigger] of SEARCH_TRIGGERS) await db.query(`alter table "${table}" disable trigger "${trigger}"`);
    await q('remove earlier seed', `delete from shop where name like 'Large Seed Shop %'`);
    await db.query(`select setseed(0.4242)`);
    await q('shops', `create temp table seed_shop on commit drop as select gen_random_uuid() as id, i from generate_series(0, ${LARGE_SEED_SHOPS - 1}) i`);
    await q('shop rows', `insert into shop (id, name, created_at) select id, 'Large Seed Shop ' || (i + 1), now() from seed_shop`);
    await q('owners', `insert into app_user (id, shop_id, email, name, password_hash, role, disabled, created_at)
      select gen_random_uuid(), id, 'owner' || (i + 1) || '@large.test', 'Seed owner ' || (i + 1), $1, 'owner', false, now() from seed_shop`, [hash]);
    const customers = Math.ceil(bikes / 2);
    await q('customers', `create temp table seed_customer on commit drop as
      select gen_random_uuid() as id, c, (select id from seed_shop where i = c % ${LARGE_SEED_SHOPS}) as shop_id from generate_series(0, ${customers - 1}) c`);
    await q('customer rows', `insert into customer (id, shop_id, name, created_at, updated_at) select id, shop_id, 'Seed rider ' || c, now(), now() from seed_customer`);
    // Bike n belongs to customer n mod customers; engine by a pseudo-random pick so shops mix engines.
    await q('bikes', `create temp table seed_bike on commit drop as
      select gen_random_uuid() as id, b.n, sc.id as customer_id, sc.shop_id, e.k,
             (${E(0)})[e.k] as family, (${E(1)})[e.k] as make, (${E(2)})[e.k] || ' ' || chr(65 + (b.n % 5)) as model,
             (${E(3)})[e.k] + ((b.n * 7) % 41) - 20 as cc, (${E(4)})[e.k] as cylinders, (${E(5)})[e.k] as base_hp,
             random() as r1, random() as r2, random() as r3, random() as r4,
             date '2019-01-01' + (b.n % 2200) as day0
        from generate_series(0, ${bikes - 1}) b(n)
        cross join lateral (select 1 + floor(random() * ${n})::int + 0 * b.n as k) e
        join seed_customer sc on sc.c = b.n % ${customers}`);
    await q('bike rows', `insert into bike (id, shop_id, customer_id, make, model, year, engine_family, displacement_cc, cylinders, created_at, updated_at)
      select id, shop_id, customer_id, make, model, 2008 + (n % 17), family, cc, cylinders, now(), now() from seed_bike`);
    // Four stages: baseline, bolt-ons, then cam and heads (in either order), gains cumulative vs baseline.
    await q('stages', `create temp table seed_stage on commit drop as
      select gen_random_uuid() as id, gen_random_uuid() as session_id, sb.id as bike_id, sb.shop_id, sb.n, k.pos, sb.base_hp, sb.day0 + k.pos * 35 as day,
             case k.pos when 0 then null
                        when 1 then round((sb.base_hp * (0.07 + 0.05 * sb.r1))::numeric, 1)::float8
                        when 2 then round((sb.base_hp * (0.07 + 0.05 * sb.r1 + 0.09 + 0.06 * sb.r2))::numeric, 1)::float8
                        else round((sb.base_hp * (0.07 + 0.05 * sb.r1 + 0.09 + 0.06 * sb.r2 + 0.10 + 0.10 * sb.r3))::numeric, 1)::float8 end as gain,
             (sb.n % 4 = 1) as heads_first, sb.r4
        from seed_bike sb cross join generate_series(0, 3) k(pos)`);
    await q('stage rows', `insert into stage (id, shop_id, bike_id, position, name, date, description, gain_peak_power_hp, gain_peak_torque_lbft, gain_area_pct, gain_average_power_hp, total_cost_cents, created_at)
      select id, shop_id, bike_id, pos, (array['Baseline','Stage 1','Stage 2','Stage 3'])[pos + 1], day,
             case pos when 0 then 'As delivered' when 1 then 'Bolt-ons and a fuel map' else null end,
             gain, gain * 1.1, gain / base_hp * 100 * 0.9, gain * 0.62, 0, now() from seed_stage`);
    await q('parts', `insert into part (id, shop_id, stage_id, category, description, part_cost_cents, labour_cost_cents, head_work_level, created_at)
      select gen_random_uuid(), st.shop_id, st.id, p.category, p.description, p.cost, p.labour, p.level, now()
        from seed_stage st
        cross join lateral (values
          ('exhaust', (array['Two-into-one header','Slip-on mufflers','Full system, stainless'])[1 + st.n % 3], 60000 + (st.n % 7) * 10000, 15000, null::text, 1),
          ('intake', (array['High-flow air cleaner','Velocity stack kit'])[1 + st.n % 2], 25000 + (st.n % 5) * 5000, 5000, null, 1),
          ('fuel-tune', 'Fuel map on the dyno', 0, 45000, null, 1),
          ('camshaft', (array['Bolt-in cam set','Chain-drive cams, adjustable pushrods','Gear-drive cams'])[1 + st.n % 3], 50000 + (st.n % 6) * 10000, 60000, null, case when st.heads_first then 3 else 2 end),
          ('cylinder-heads', (array['Mild port and valve job','Full port, bigger valves','CNC ported heads','Replacement heads','Clean-up port'])[1 + st.n % 5], 30000 + (st.n % 8) * 15000, 40000,
             (array['mild-port','full-port','cnc','replacement','mild-port'])[1 + st.n % 5], case when st.heads_first then 2 else 3 end),
          ('big-bore', 'Big-bore cylinders and pistons', 90000, 50000, null, case when st.n % 3 = 0 then 3 else -1 end)
        ) as p(category, description, cost, labour, level, pos)
       where p.pos = st.pos`);
    await q('stage costs', `update stage s set total_cost_cents = c.total
        from (select p.stage_id, sum(p.part_cost_cents + p.labour_cost_cents)::int as total from part p join seed_stage st on st.id = p.stage_id group by p.stage_id) c
       where c.stage_id = s.id`);
    // One dyno per shop; one session per stage (the day the stage was measured), run by the owner.
    await q('dynos', `insert into dyno (id, shop_id, name, kind, created_at) select gen_random_uuid(), id, 'Bay ' || (i + 1), 'inertia', now() from seed_shop`);
    await q('sessions', `insert into dyno_session (id, shop_id, bike_id, started_at, dyno_id, operator_id, ambient_temp_c, baro_kpa, humidity_pct, correction_standard, notes, created_at)
      select st.session_id, st.shop_id, st.bike_id, st.day + interval '9 hours', d.id, u.id, 18 + (st.n % 15), 99 + (st.n % 30) / 10.0, 30 + (st.n % 40),
             'sae-j1349', case when st.n % 7 = 0 then 'Fan on, second gear' else null end, st.day + interval '9 hours'
        from seed_stage st join dyno d on d.shop_id = st.shop_id join app_user u on u.shop_id = st.shop_id and u.role = 'owner'`);
    // Ten runs a bike: 3 at the baseline, 2 + 2 at the middle stages, 3 at the last.
    const runsPerBike = 10;
    await q('runs', `insert into run (id, shop_id, bike_id, session_id, stage_id, label, sequence, raw_key, raw_sha256, raw_size_bytes, original_name, content_type, status,
                                 peak_power_hp, peak_power_rpm, peak_torque_lbft, peak_torque_rpm, rpm_min, rpm_max, points, correction_standard, correction_factor,
                                 warnings, tags, note, created_at, updated_at, search_text)
      select gen_random_uuid(), st.shop_id, st.bike_id, st.session_id, st.id, 'Pull ' || (r.i + 1), r.i + 1, 'seed/' || st.id || '/' || r.i, md5(st.id::text || r.i) || md5(r.i || st.id::text), 40000,
             'pull-' || (r.i + 1) || '.csv', 'text/csv', 'ready',
             round((st.base_hp + coalesce(st.gain, 0) + (random() - 0.5))::numeric, 2)::float8, 5200 + (st.n % 9) * 100,
             round(((st.base_hp + coalesce(st.gain, 0)) * 1.15 + (random() - 0.5))::numeric, 2)::float8, 3200 + (st.n % 7) * 100,
             1800, 6200, 0, 'sae-j1349', 1 + (random() - 0.5) * 0.04,
             '[]'::jsonb,
             r.tags, r.note,
             st.day + interval '9 hours 20 minutes' + r.i * interval '7 minutes', now(),
             -- As run_search_text_of() writes it: file, label, note, tags, make, model, family, customer, stage.
             concat_ws(' ', 'pull-' || (r.i + 1) || '.csv', 'Pull ' || (r.i + 1), r.note, array_to_string(r.tags, ' '), sb.make, sb.model, sb.family, 'Seed rider ' || sc.c,
                       (array['Baseline','Stage 1','Stage 2','Stage 3'])[st.pos + 1])
        from seed_stage st
        join seed_bike sb on sb.id = st.bike_id
        join seed_customer sc on sc.id = sb.customer_id
        cross join lateral (select g as i, case st.pos when 0 then 2 when 3 then 2 else 1 end as last
                              from generate_series(0, case st.pos when 0 then 2 when 3 then 2 else 1 end) g) r0
        cross join lateral (select r0.i, r0.last,
                                   case when r0.i = r0.last then array['reference'] when st.n % 11 = 0 then array['customer-present'] else '{}'::text[] end as tags,
                                   case (st.n + r0.i) % 9 when 0 then 'Pinging above 3,800 rpm; pulled timing' when 3 then 'Lean at the top end, richened' when 5 then 'Repeat pull, cooling fan on' else null end as note) r`);
    await q('reference runs', `update stage s set reference_run_id = r.id
        from run r join seed_stage st on st.id = r.stage_id
       where r.stage_id = s.id and r.tags @> array['reference']`);
    // A saved comparison per bike (baseline reference run against the last stage's), a gain
    // report for every other bike, and the audit lines those and the uploads would have written.
    await q('comparisons', `insert into comparison (id, shop_id, name, bike_id, baseline_run_id, run_ids, options, note, created_by_id, created_at)
      select gen_random_uuid(), sb.shop_id, 'Baseline vs Stage 3', sb.id, s0.reference_run_id, jsonb_build_array(s0.reference_run_id, s3.reference_run_id),
             $1::jsonb, null, u.id, s3.date + interval '12 hours'
        from seed_bike sb
        join stage s0 on s0.bike_id = sb.id and s0.position = 0
        join stage s3 on s3.bike_id = sb.id and s3.position = 3
        join app_user u on u.shop_id = sb.shop_id and u.role = 'owner'`, [JSON.stringify({ correction: 'sae-j1349', smooth: 0, units: 'imperial', bandWidthRpm: 500 })]);
    await q('reports', `insert into report (id, shop_id, bike_id, comparison_id, number, version, pdf_key, pdf_sha256, pdf_size_bytes, technician_note, summary, created_by_id, created_at)
      select gen_random_uuid(), c.shop_id, c.bike_id, c.id, 'R-' || to_char(c.created_at, 'YYYY') || '-' || lpad((row_number() over (partition by c.shop_id order by c.created_at, c.id))::text, 6, '0'),
             1, 'seed/reports/' || c.id || '.pdf', md5(c.id::text) || md5(c.bike_id::text), 120000, null, null, c.created_by_id, c.created_at + interval '10 minutes'
        from comparison c join seed_bike sb on sb.id = c.bike_id where sb.n % 2 = 0`);
    await q('audit lines', `insert into audit_entry (id, shop_id, user_id, action, entity_type, entity_id, details, created_at)
      select gen_random_uuid(), x.shop_id, u.id, x.action, x.entity_type, x.entity_id::text, null, x.at
        from (select r.shop_id, 'run.upload' as action, 'run' as entity_type, r.id as entity_id, r.created_at as at from run r join seed_bike sb on sb.id = r.bike_id
              union all select s.shop_id, 'session.create', 'session', s.id, s.started_at from dyno_session s join seed_bike sb on sb.id = s.bike_id
              union all select c.shop_id, 'comparison.create', 'comparison', c.id, c.created_at from comparison c join seed_bike sb on sb.id = c.bike_id
              union all select rp.shop_id, 'report.create', 'report', rp.id, rp.created_at from report rp join seed_bike sb on sb.id = rp.bike_id) x
        join app_user u on u.shop_id = x.shop_id and u.role = 'owner'`);
    await db.query(`select set_config('pullbook.build_index_deferred', 'off', true)`);
    for (const [table, trigger] of SEARCH_TRIGGERS) await db.query(`alter table "${table}" enable trigger "${trigger}"`);
    await q('statistics', `analyze bike, stage, part, run, dyno_session, comparison, report, audit_entry`);
    await q('build index', `select build_index_refresh(array(select id from seed_bike))`);
    await db.query('commit');
    const counts = await db.query(`select (select count(*) from shop where name like 'Large Seed Shop %')::int as shops,
        (select count(*) from bike b join shop s on s.id = b.shop_id where s.name like 'Large Seed Shop %')::int as bikes,
        (select count(*) from stage b join shop s on s.id = b.shop_id where s.name like 'Large Seed Shop %')::int as stages,
        (select count(*) from part b join shop s on s.id = b.shop_id where s.name like 'Large Seed Shop %')::int as parts,
        (select count(*) from run b join shop s on s.id = b.shop_id where s.name like 'Large Seed Shop %')::int as runs,
        (select count(*) from dyno_session b join shop s on s.id = b.shop_id where s.name like 'Large Seed Shop %')::int as sessions,
        (select count(*) from comparison b join shop s on s.id = b.shop_id where s.name like 'Large Seed Shop %')::int as comparisons,
        (select count(*) from report b join shop s on s.id = b.shop_id where s.name like 'Large Seed Shop %')::int as reports,
        (select count(*) from audit_entry b join shop s on s.id = b.shop_id where s.name like 'Large Seed Shop %')::int as "auditEntries"`);
    await q('vacuum analyze', 'vacuum analyze');
    const c = counts.rows[0] as Omit<SeedLargeResult, 'ms'>;
    if (runsPerBike * bikes !== c.runs) log(`  note: ${c.runs} runs for ${bikes} bikes`);
    return { ...c, ms: Date.now() - t0 };
  } catch (e) {
    await db.query('rollback').catch(() => undefined);
    throw e;
  } finally {
    await db.end();
  }
}

function argValue(name: string): string | undefined {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const url = argValue('--url') ?? process.env.DATABASE_URL_LARGE ?? DEFAULT_LARGE_URL;
  const bikes = Number(argValue('--bikes') ?? 10_000);
  console.log(`[seed:large] ${bikes} bikes into ${url.replace(/\/\/[^@]*@/, '//…@')}`);
  seedLarge(url, { bikes, log: (s) => console.log(s) }).then(
    (r) => console.log(`[seed:large] ${r.shops} shops, ${r.bikes} bikes, ${r.stages} stages, ${r.parts} parts, ${r.runs} runs, ${r.sessions} sessions, ${r.comparisons} comparisons, ${r.reports} reports, ${r.auditEntries} audit lines in ${(r.ms / 1000).toFixed(1)} s; sign in as owner1@large.test / ${LARGE_SEED_PASSWORD}`),
    (e) => {
      console.error(`[seed:large] failed: ${e instanceof Error ? e.message : String(e)}`);
      process.exit(1);
    },
  );
}
