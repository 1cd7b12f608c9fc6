// Behind a proxy trusted with TRUST_PROXY, X-Forwarded-Proto is believed and HSTS is sent; without
// it the header is ignored. Its own file: the app under test is built with its own environment
// (passport keeps one strategy per process, so two apps in one file would share it).
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { INestApplication } from '@nestjs/common';
import { createApp } from '../src/app.js';
import { testEnv } from './support/test-app.js';

let plainApp: INestApplication;
let proxiedApp: INestApplication;
beforeAll(async () => {
  plainApp = await createApp(testEnv(), { logger: false });
  proxiedApp = await createApp({ ...testEnv(), TRUST_PROXY: 1 }, { logger: false });
});
afterAll(async () => {
  await plainApp.close();
  await proxiedApp.close();
});

describe('TRUST_PROXY', () => {
  it('is off by default: a made-up X-Forwarded-Proto gets no HSTS', async () => {
    const res = await request(plainApp.getHttpServer()).get('/api/health/live').set('X-Forwarded-Proto', 'https');
    expect(res.headers['strict-transport-security']).toBeUndefined();
  });

  it('with one trusted proxy, https from it gets HSTS', async () => {
    const res = await request(proxiedApp.getHttpServer()).get('/api/health/live').set('X-Forwarded-Proto', 'https');
    expect(res.headers['strict-transport-security']).toMatch(/max-age=31536000/);
  });
});
