import { afterEach, describe, expect, it } from 'vitest';
import { asQuery, preparedStatement, useNamedStatements } from '@server/db/prepared-query';

afterEach(() => useNamedStatements(true));

describe('prepared statements', () => {
  it('numbers ? placeholders in order and names the statement after its text', () => {
    const a = preparedStatement('select * from run where shop_id = ? and id = any(?::uuid[])');
    expect(a.text).toBe('select * from run where shop_id = $1 and id = any($2::uuid[])');
    expect(a.name).toMatch(/^pb_[0-9a-f]{24}$/);
    expect(preparedStatement('select * from run where shop_id = ? and id = any(?::uuid[])').name).toBe(a.name);
    expect(preparedStatement('select * from bike where shop_id = ?').name).not.toBe(a.name);
  });

  it('sends names unless they are turned off (DATABASE_NAMED_STATEMENTS=false, for a transaction-mode pooler)', () => {
    const st = { name: 'pullbook-x', text: 'select $1::int' };
    expect(asQuery(st, [1])).toEqual({ name: 'pullbook-x', text: 'select $1::int', values: [1] });
    useNamedStatements(false);
    expect(asQuery(st, [1])).toEqual({ text: 'select $1::int', values: [1] });
  });
});
