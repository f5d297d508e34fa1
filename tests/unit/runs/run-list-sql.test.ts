import { describe, expect, it } from 'vitest';
import { decodeCursor, encodeCursor, orderBy, pageSql, sortSpec } from '@server/modules/runs/run-list-sql';
import type { Actor } from '@server/http/actor';
import { runListQuery } from '@shared/schemas/run';

/** The run list's SQL text and cursors (no database): what each sort orders by and how cursors round-trip. */

const owner: Actor = { id: '11111111-1111-4111-8111-111111111111', shopId: '22222222-2222-4222-8222-222222222222', role: 'owner', email: 'o@x.test', name: 'O', customerId: null };
const customer: Actor = { ...owner, role: 'customer', customerId: '33333333-3333-4333-8333-333333333333' };
const ID = '44444444-4444-4444-8444-444444444444';

describe('sort specs', () => {
  it('orders peaks with runs without a peak last in both directions, then newest, then id', () => {
    expect(orderBy(sortSpec('-peakPowerHp'))).toBe(`coalesce(r.peak_power_hp, '-Infinity'::float8) desc, r.created_at desc, r.id asc`);
    expect(orderBy(sortSpec('peakTorqueLbft'))).toBe(`coalesce(r.peak_torque_lbft, 'Infinity'::float8) asc, r.created_at desc, r.id asc`);
    expect(orderBy(sortSpec(undefined))).toBe('r.created_at desc, r.id asc');
    expect(sortSpec('createdAt').name).toBe('createdAt');
  });
});

describe('cursors', () => {
  it('round-trip the last row and refuse another sort or a forged one', () => {
    const c = { sort: '-peakPowerHp', key: '112.35', createdAt: '2026-12-02 16:40:00.123456+00', id: ID };
    const text = encodeCursor(c);
    expect(decodeCursor(text, '-peakPowerHp')).toEqual(c);
    expect(() => decodeCursor(text, 'peakPowerHp')).toThrow(/cursor/);
    expect(() => decodeCursor('bm9wZQ', '-createdAt')).toThrow(/cursor/);
    const sqlish = encodeCursor({ ...c, key: "1; drop table run" });
    expect(() => decodeCursor(sqlish, '-peakPowerHp')).toThrow(/cursor/);
    expect(decodeCursor(encodeCursor({ ...c, key: '-Infinity' }), '-peakPowerHp').key).toBe('-Infinity');
  });
});

describe('page statement', () => {
  it('binds every value and limits a customer to their own bikes', () => {
    const q = runListQuery.parse({ q: "o'brien", tag: 'x', page: '3', pageSize: '10' });
    const { sql, params } = pageSql(customer, q);
    expect(sql).not.toContain("o'brien");
    expect(params).toEqual([owner.shopId, owner.shopId, customer.customerId, 'x', "%o'brien%", 11, 20]);
    expect(sql).toContain('b.customer_id = ?');
    expect((sql.match(/\?/g) ?? []).length).toBe(params.length);
  });

  it('keyset pages start after the cursor instead of an offset', () => {
    const cursor = encodeCursor({ sort: '-createdAt', key: '2026-12-02 16:40:00.5+00', createdAt: '2026-12-02 16:40:00.5+00', id: ID });
    const { sql, params } = pageSql(owner, runListQuery.parse({ cursor }));
    expect(sql).toContain('r.created_at <= ?::timestamptz and (r.created_at < ?::timestamptz or r.id > ?)');
    expect(params.slice(-2)).toEqual([26, 0]);
    expect(sql).toContain('r.deleted_at is null');
  });
});
