import { describe, expect, it } from 'vitest';
import { ConfigError, parseEnv } from './env.js';

const base = {
  DATABASE_URL: 'postgres://u:p@127.0.0.1:5432/db',
  S3_ENDPOINT: 'http://127.0.0.1:9390',
  S3_ACCESS_KEY_ID: 'k',
  S3_SECRET_ACCESS_KEY: 's',
  S3_BUCKET: 'bucket',
  SMTP_PORT: '2525',
  JWT_SECRET: 'x'.repeat(32),
};

describe('parseEnv', () => {
  it('names every missing or malformed key', () => {
    const attempt = () => parseEnv({ JWT_SECRET: 'short' });
    expect(attempt).toThrow(ConfigError);
    for (const key of ['DATABASE_URL', 'S3_ENDPOINT', 'S3_BUCKET', 'SMTP_PORT', 'JWT_SECRET'])
      expect(attempt).toThrow(new RegExp(`\\b${key}: `));
  });

  it('sends the session cookie over HTTPS only by default in production, not on loopback development', () => {
    expect(parseEnv({ ...base, NODE_ENV: 'production', APP_URL: 'https://ledger.example' }).COOKIE_SECURE).toBe(true);
    expect(parseEnv({ ...base, NODE_ENV: 'development' }).COOKIE_SECURE).toBe(false);
    expect(
      parseEnv({ ...base, NODE_ENV: 'production', APP_URL: 'https://ledger.example', COOKIE_SECURE: 'false' })
        .COOKIE_SECURE,
    ).toBe(false);
    expect(parseEnv({ ...base, COOKIE_SECURE: 'true' }).COOKIE_SECURE).toBe(true);
  });

  it('needs the public address for e-mailed links in production, and refuses the test-only idle override there', () => {
    expect(() => parseEnv({ ...base, NODE_ENV: 'production' })).toThrow(/APP_URL: required in production/);
    expect(() =>
      parseEnv({ ...base, NODE_ENV: 'production', APP_URL: 'https://ledger.example', SESSION_IDLE_OVERRIDE_S: '10' }),
    ).toThrow(/SESSION_IDLE_OVERRIDE_S/);
    expect(parseEnv({ ...base, SESSION_IDLE_OVERRIDE_S: '10' }).SESSION_IDLE_OVERRIDE_S).toBe(10);
  });
});
