import { describe, expect, it } from 'vitest';
import { StorageUnavailableError, unavailableDependency } from './unavailable.js';

const withCode = (code: string) => Object.assign(new Error('x'), { code });

describe('unavailableDependency', () => {
  it('finds PostgreSQL away in socket codes, SQLSTATEs and node-postgres messages, also wrapped as a cause', () => {
    expect(unavailableDependency(withCode('ECONNREFUSED'))).toBe('database');
    // 57P01: terminating connection due to administrator command (pg_ctl stop -m fast).
    expect(unavailableDependency(new Error('query failed', { cause: withCode('57P01') }))).toBe('database');
    expect(unavailableDependency(withCode('57P03'))).toBe('database');
    expect(unavailableDependency(new Error('Connection terminated unexpectedly'))).toBe('database');
    expect(unavailableDependency(new Error('timeout exceeded when trying to connect'))).toBe('database');
    expect(unavailableDependency(new AggregateError([withCode('ECONNREFUSED')]))).toBe('database');
  });

  it('finds S3 away in StorageUnavailableError', () => {
    expect(unavailableDependency(new StorageUnavailableError(withCode('ECONNREFUSED')))).toBe('storage');
  });

  it('leaves every other error alone (unique violations, bad input, bugs stay 409/400/500)', () => {
    expect(unavailableDependency(withCode('23505'))).toBeNull();
    expect(unavailableDependency(withCode('22P02'))).toBeNull();
    expect(unavailableDependency(new TypeError('x is undefined'))).toBeNull();
    expect(unavailableDependency('a string')).toBeNull();
    expect(unavailableDependency(null)).toBeNull();
  });
});
