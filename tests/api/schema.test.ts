import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('database schema', () => {
  it('matches the entities after all migrations (no missing tables or columns)', async () => {
    // `safe` leaves out drops: extra objects made by hand-written migrations (indexes, the
    // session table) are allowed; anything the entities need but the migrations lack is not.
    const sql = await t.deps.orm.getSchemaGenerator().getUpdateSchemaSQL({ safe: true, wrap: false });
    const statements = sql
      .split('\n')
      .filter((l) => l.trim() && !l.startsWith('--') && !/^set /i.test(l))
      // Indexes made by hand-written migrations (trigram, full-text, expression) are not in the entities.
      .filter((l) => !/^drop index /i.test(l));
    expect(statements).toEqual([]);
  });
});
