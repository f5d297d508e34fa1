/**
 * Builds the real app for a test file on a database of its own (cloned from the migrated
 * template that `npm test` prepares), with the S3 and SMTP fakes of the test run.
 */
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import supertest from 'supertest';
import type { Role } from '@shared/roles';
import { loadConfig } from '@server/config/env';
import { buildDeps, startWorkers, stopWorkers } from '@server/main';
import { createApp, type CreatedApp } from '@server/app';
import type { AppDeps } from '@server/app-deps';
import { hashPassword } from '@server/modules/auth/auth.service';
import { Shop } from '@server/modules/shops/shop.entity';
import { User } from '@server/modules/users/user.entity';
import { Customer } from '@server/modules/customers/customer.entity';
import { Bike } from '@server/modules/bikes/bike.entity';

export const TEST_PASSWORD = 'correct-horse-battery';

export interface TestShop {
  shop: Shop;
  users: Record<Role, User>;
  customer: Customer;
  /** A bike of `customer` (the customer user's own bike). */
  bike: Bike;
  /** A bike of another customer of the same shop. */
  otherBike: Bike;
}

export interface TestApp extends CreatedApp {
  deps: AppDeps;
  request: ReturnType<typeof supertest>;
  /** A supertest agent signed in as that user (cookie kept). */
  signIn(user: User | string, password?: string): Promise<ReturnType<typeof supertest.agent>>;
  createShop(name: string): Promise<TestShop>;
  close(): Promise<void>;
}

function requireEnv(name: string) {
  const v = process.env[name];
  if (!v) throw new Error(`${name} is not set: run the tests with \`npm test\`, which starts the test services`);
  return v;
}

let passwordHash: Promise<string> | undefined;

/**
 * `databaseUrl`: run on that (already migrated) database instead of a clone of the template; it
 * is left in place on close.
 */
export async function createTestApp(opts: { clientDir?: string; env?: Record<string, string>; databaseUrl?: string; workers?: boolean } = {}): Promise<TestApp> {
  const templateUrl = requireEnv('TEST_DATABASE_TEMPLATE_URL');
  const dbName = `pbt_${randomBytes(6).toString('hex')}`;
  if (!opts.databaseUrl) {
    const admin = new pg.Client({ connectionString: templateUrl.replace(/\/[^/]+$/, '/postgres') });
    await admin.connect();
    await admin.query(`create database "${dbName}" template pullbook_template`);
    await admin.end();
  }

  const config = loadConfig({ ...process.env, DATABASE_URL: opts.databaseUrl ?? templateUrl.replace(/\/[^/]+$/, `/${dbName}`), PUBLIC_URL: 'http://127.0.0.1:3999', MAIL_POLL_SECONDS: '0.5', MAIL_RETRY_DELAY_SECONDS: '1', MAIL_RETRY_LIMIT: '3', ...opts.env });
  const deps = await buildDeps(config, { poolMax: 5 });
  // The mail worker (and the account look-ups that queue mail), as a started server runs them.
  if (opts.workers !== false) await startWorkers(deps);
  const created = createApp(deps, { clientDir: opts.clientDir });
  passwordHash ??= hashPassword(TEST_PASSWORD, 10);

  return {
    ...created,
    deps,
    request: supertest(created.app),
    async signIn(user, password = TEST_PASSWORD) {
      const agent = supertest.agent(created.app);
      const email = typeof user === 'string' ? user : user.email;
      const res = await agent.post('/api/auth/login').send({ email, password });
      if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
      return agent;
    },
    async createShop(name) {
      const em = deps.orm.em.fork();
      const hash = await passwordHash!;
      const slug = name.toLowerCase().replace(/[^a-z0-9]+/g, '-');
      const shop = em.create(Shop, { name } as Shop);
      const customer = em.create(Customer, { shop, name: `${name} Rider`, email: `rider@${slug}.test` } as Customer);
      const otherCustomer = em.create(Customer, { shop, name: `${name} Other Rider` } as Customer);
      const users = {} as Record<Role, User>;
      for (const role of ['owner', 'tuner', 'desk', 'customer'] as Role[]) {
        users[role] = em.create(User, { shop, email: `${role}@${slug}.test`, name: `${name} ${role}`, role, passwordHash: hash, customer: role === 'customer' ? customer : null } as User);
      }
      const bike = em.create(Bike, { shop, customer, make: 'Testmake', model: 'Own', year: 2020, engineFamily: 'TM-100', displacementCc: 1640, cylinders: 2 } as Bike);
      const otherBike = em.create(Bike, { shop, customer: otherCustomer, make: 'Testmake', model: 'Other', year: 2018, engineFamily: 'TM-100', displacementCc: 1640, cylinders: 2 } as Bike);
      await em.flush();
      return { shop, users, customer, bike, otherBike };
    },
    async close() {
      await created.close();
      await stopWorkers(deps);
      await deps.orm.close();
      if (opts.databaseUrl) return;
      const c = new pg.Client({ connectionString: templateUrl.replace(/\/[^/]+$/, '/postgres') });
      await c.connect();
      // No FORCE: terminating a straggling connection surfaces as an unhandled error in the
      // test process. If something still holds the database, the run's cluster is removed anyway.
      await c.query(`drop database if exists "${dbName}"`).catch(() => undefined);
      await c.end();
    },
  };
}
