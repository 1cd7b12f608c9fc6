import { sql } from 'drizzle-orm';
import { PgDialect } from 'drizzle-orm/pg-core';
import { describe, expect, it } from 'vitest';
import { inlineParams } from './copy-out.js';

const dialect = new PgDialect();

describe('inlineParams (COPY takes no parameters)', () => {
  it('writes each value as a quoted literal, escaping quotes and backslashes', () => {
    const { sql: text, params } = dialect.sqlToQuery(
      sql`select * from t where a = ${"O'Brien"} and b ilike ${'%a\\b%'} and c < ${50}::int and d = ${true} and e is not distinct from ${null}`,
    );
    expect(inlineParams(text, params)).toBe(
      `select * from t where a = 'O''Brien' and b ilike  E'%a\\\\b%' and c < '50'::int and d = 'true' and e is not distinct from null`,
    );
  });

  it('reads $10 as the tenth value, not the first followed by a 0', () => {
    const values = Array.from({ length: 10 }, (_, i) => `v${i + 1}`);
    const query = sql.join(
      values.map((v) => sql`${v}`),
      sql`, `,
    );
    const { sql: text, params } = dialect.sqlToQuery(sql`select ${query}`);
    expect(inlineParams(text, params)).toBe(`select ${values.map((v) => `'${v}'`).join(', ')}`);
  });

  it('refuses values it cannot write safely, and placeholders that do not match the values', () => {
    expect(() => inlineParams('select $1', [['a', 'b']])).toThrow(/object value/);
    expect(() => inlineParams('select $1', [Number.NaN])).toThrow(/number value/);
    expect(() => inlineParams('select $2', ['a', 'b'])).toThrow(/do not match/);
    expect(() => inlineParams('select $1, $3', ['a', 'b'])).toThrow(/no value for \$3/);
  });
});
