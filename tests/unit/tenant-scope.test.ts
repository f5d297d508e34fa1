import { describe, expect, it } from 'vitest';
import { customerFilterOf, NO_CUSTOMER, tenantParams, tenantScope } from '@server/http/tenant-scope';
import type { Actor } from '@server/http/actor';

// Invented ids: only their equality matters.
const SHOP = '11111111-1111-4111-8111-111111111111';
const CUSTOMER = '22222222-2222-4222-8222-222222222222';
const BIKE = '33333333-3333-4333-8333-333333333333';

const actor = (role: Actor['role'], customerId: string | null = null): Actor =>
  ({ id: '44444444-4444-4444-8444-444444444444', shopId: SHOP, role, customerId, email: 'x@example.test', name: 'X' }) as Actor;

describe('tenantScope', () => {
  it('limits staff to their shop only, whatever the customer path', () => {
    for (const role of ['owner', 'tuner', 'desk'] as const) {
      expect(tenantScope(actor(role), 'bike.customer')).toEqual({ shop: SHOP });
      expect(customerFilterOf(actor(role))).toBeNull();
      expect(tenantParams(actor(role))).toEqual({ shopId: SHOP, customerId: null });
    }
  });

  it('limits a customer to their own records through the path to the customer', () => {
    expect(tenantScope(actor('customer', CUSTOMER), 'customer')).toEqual({ shop: SHOP, customer: CUSTOMER });
    expect(tenantScope(actor('customer', CUSTOMER), 'bike.customer')).toEqual({ shop: SHOP, bike: { customer: CUSTOMER } });
    expect(tenantParams(actor('customer', CUSTOMER))).toEqual({ shopId: SHOP, customerId: CUSTOMER });
  });

  it('gives an unlinked customer account a customer id that matches nothing, never the whole shop', () => {
    expect(NO_CUSTOMER).toBe('00000000-0000-0000-0000-000000000000');
    expect(tenantScope(actor('customer', null), 'customer')).toEqual({ shop: SHOP, customer: NO_CUSTOMER });
    expect(tenantParams(actor('customer', null)).customerId).toBe(NO_CUSTOMER);
  });

  it('applies no customer filter when the query names no customer path (records customers never read this way)', () => {
    expect(tenantScope(actor('customer', CUSTOMER))).toEqual({ shop: SHOP });
  });

  it('merges the customer filter into a nested filter given in extra, without changing the caller’s object', () => {
    const extra = { id: BIKE, bike: { id: BIKE, make: 'Invented' } };
    const where = tenantScope(actor('customer', CUSTOMER), 'bike.customer', extra);
    expect(where).toEqual({ shop: SHOP, id: BIKE, bike: { id: BIKE, make: 'Invented', customer: CUSTOMER } });
    expect(extra).toEqual({ id: BIKE, bike: { id: BIKE, make: 'Invented' } });
    // Three levels deep: every level is created or merged.
    expect(tenantScope(actor('customer', CUSTOMER), 'run.bike.customer', { run: { status: 'ready' } })).toEqual({
      shop: SHOP,
      run: { status: 'ready', bike: { customer: CUSTOMER } },
    });
  });

  it('keeps the actor’s shop even when extra names another one', () => {
    const other = '55555555-5555-4555-8555-555555555555';
    expect(tenantScope(actor('owner'), undefined, { shop: other, name: 'A' })).toEqual({ shop: SHOP, name: 'A' });
  });
});
