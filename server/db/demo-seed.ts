/**
 * The invented demo scenario: two shops (so tenant separation is visible), their staff, and a
 * handful of customers and bikes. Every name, make and figure here is made up.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { AppDeps } from '../app-deps';
import { Shop } from '../modules/shops/shop.entity';
import { User } from '../modules/users/user.entity';
import { Customer } from '../modules/customers/customer.entity';
import { Bike } from '../modules/bikes/bike.entity';
import { Dyno } from '../modules/dynos/dyno.entity';
import { hashPassword } from '../modules/auth/auth.service';
import type { Role } from '@shared/roles';

export const DEMO_PASSWORD = 'pullbook-demo';
export const DEMO_SIGN_INS: { email: string; role: Role }[] = [
  { email: 'owner@demo.pullbook.test', role: 'owner' },
  { email: 'tuner@demo.pullbook.test', role: 'tuner' },
  { email: 'desk@demo.pullbook.test', role: 'desk' },
  { email: 'customer@demo.pullbook.test', role: 'customer' },
];

export interface DemoIds {
  shopId: string;
  otherShopId: string;
  users: Record<Role, string>;
  bikes: { id: string; label: string }[];
  dynoId: string;
}

/** Hooks that extend the demo (sessions, stages, runs…) register here and run after the base data. */
type DemoExtension = (deps: AppDeps, em: EntityManager, ids: DemoIds) => Promise<void>;
const extensions: DemoExtension[] = [];
export function extendDemo(ext: DemoExtension) {
  extensions.push(ext);
}

const BIKES: { customer: number; make: string; model: string; year: number; family: string; cc: number; cyl: number; vin?: string }[] = [
  { customer: 0, make: 'Halvorsen', model: 'Aldermoor Tourer', year: 2019, family: 'Halvorsen HV-1750', cc: 1746, cyl: 2, vin: 'HV4TR17A0KX000417' },
  { customer: 1, make: 'Halvorsen', model: 'Brisca S', year: 2021, family: 'Halvorsen HV-1870', cc: 1868, cyl: 2 },
  { customer: 2, make: 'Tamarack', model: 'Corrow', year: 2014, family: 'Tamarack T2-1580', cc: 1584, cyl: 2 },
  { customer: 3, make: 'Halvorsen', model: 'Dunmere', year: 2017, family: 'Halvorsen HV-1750', cc: 1746, cyl: 2 },
  { customer: 4, make: 'Orrin', model: 'Ostrel 900', year: 2020, family: 'Orrin R3-900', cc: 898, cyl: 3 },
  { customer: 1, make: 'Tamarack', model: 'Pellworth', year: 2016, family: 'Tamarack T2-1690', cc: 1690, cyl: 2 },
];

const CUSTOMERS = [
  { name: 'Dana Whitlock', email: 'customer@demo.pullbook.test', phone: '555-0101' },
  { name: 'Marco Feliciano', email: 'marco.f@example.com', phone: '555-0144' },
  { name: 'Priya Ramaswamy', email: 'priya.r@example.com', phone: '555-0178' },
  { name: 'Tom Okafor', email: 'tom.okafor@example.com', phone: '555-0122' },
  { name: 'Lena Brandt', email: 'lena.brandt@example.com', phone: '555-0190' },
];

/** Create the demo data when the database has no shop yet. Returns null when it already had one. */
export async function seedDemoIfEmpty(deps: AppDeps): Promise<DemoIds | null> {
  const em = deps.orm.em.fork();
  if ((await em.count(Shop, {})) > 0) return null;
  const hash = await hashPassword(DEMO_PASSWORD, deps.config.BCRYPT_ROUNDS);

  const shop = em.create(Shop, {
    name: 'Kestrel Ridge Motorworks',
    address: '1450 Foundry Lane, Unit 3\nMillbrook, OR 97000',
    phone: '(555) 010-4477',
    email: 'bench@kestrelridge.example',
    units: 'imperial',
    paperSize: 'letter',
    defaultCorrection: 'sae-j1349',
    timeZone: 'America/Los_Angeles',
  } as Shop);
  const dyno = em.create(Dyno, { shop, name: 'Bay 1 roller', kind: 'inertia', notes: 'Inertia chassis dyno, fan and extraction on bay 1' } as Dyno);
  em.create(Dyno, { shop, name: 'Bay 2 load unit', kind: 'eddy-current', notes: 'Eddy-current load dyno for steady-state tuning' } as Dyno);
  const customers = CUSTOMERS.map((c) => em.create(Customer, { ...c, shop, notes: null } as Customer));
  const bikes = BIKES.map((b) =>
    em.create(Bike, {
      shop,
      customer: customers[b.customer],
      make: b.make,
      model: b.model,
      year: b.year,
      vin: b.vin ?? null,
      engineFamily: b.family,
      displacementCc: b.cc,
      cylinders: b.cyl,
      notes: null,
    } as Bike),
  );
  const staff: Record<Role, User> = {} as Record<Role, User>;
  const names: Record<Role, string> = { owner: 'Rosa Kestrel', tuner: 'Eli Navarro', desk: 'Jamie Cho', customer: 'Dana Whitlock' };
  for (const { email, role } of DEMO_SIGN_INS) {
    staff[role] = em.create(User, { shop, email, name: names[role], role, passwordHash: hash, customer: role === 'customer' ? customers[0] : null } as User);
  }

  // A second shop with its own people and bikes: none of it is visible to the first.
  const other = em.create(Shop, { name: 'Bluewater Dyno Lab', address: '88 Harbour Road, Eastport', phone: '(555) 020-9000', units: 'metric', paperSize: 'a4', defaultCorrection: 'din-70020', timeZone: 'Europe/London' } as Shop);
  em.create(User, { shop: other, email: 'owner@bluewater.pullbook.test', name: 'Noor Haddad', role: 'owner', passwordHash: hash } as User);
  const otherCustomer = em.create(Customer, { shop: other, name: 'Sam Iverson', email: 'sam.iverson@example.com', phone: '555-0300' } as Customer);
  em.create(Bike, { shop: other, customer: otherCustomer, make: 'Orrin', model: 'Quarrel 1200', year: 2022, engineFamily: 'Orrin R2-1200', displacementCc: 1200, cylinders: 2 } as Bike);
  await em.flush();

  const ids: DemoIds = {
    shopId: shop.id,
    otherShopId: other.id,
    users: Object.fromEntries(Object.entries(staff).map(([r, u]) => [r, u.id])) as Record<Role, string>,
    bikes: bikes.map((b) => ({ id: b.id, label: `${b.year} ${b.make} ${b.model}` })),
    dynoId: dyno.id,
  };
  for (const ext of extensions) await ext(deps, em, ids);
  return ids;
}
