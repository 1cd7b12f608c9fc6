// Liveness and readiness as a load balancer reads them: 503 when a required service is away.
// The "away" apps point at a loopback port nothing listens on (the real services stay up).
import net from 'node:net';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { INestApplication } from '@nestjs/common';
import { createApp } from '../src/app.js';
import { testEnv } from './support/test-app.js';

/** A loopback port with no listener: bind one, note it, close it. */
async function deadPort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as net.AddressInfo;
  await new Promise((resolve) => server.close(resolve));
  return port;
}

const apps: INestApplication[] = [];
let up: ReturnType<typeof request>;
let noStorage: ReturnType<typeof request>;
let noMail: ReturnType<typeof request>;
beforeAll(async () => {
  const make = async (overrides: Record<string, unknown>) => {
    const app = await createApp({ ...testEnv(), ...overrides }, { logger: false });
    apps.push(app);
    return request(app.getHttpServer());
  };
  const port = await deadPort();
  up = await make({});
  noStorage = await make({ S3_ENDPOINT: `http://127.0.0.1:${port}` });
  noMail = await make({ SMTP_PORT: port });
}, 60_000);
afterAll(async () => {
  for (const app of apps) await app.close();
});

describe('health', () => {
  it('is ready (200) with every service up, at /api/health and /api/health/ready', async () => {
    for (const path of ['/api/health', '/api/health/ready']) {
      const res = await up.get(path);
      expect(res.status, path).toBe(200);
      expect(res.body).toEqual({ status: 'up', services: { database: 'up', objectStorage: 'up', mail: 'up' } });
    }
  });

  it('is not ready (503) without object storage, and alive all the same', async () => {
    const storage = await noStorage.get('/api/health/ready');
    expect(storage.status).toBe(503);
    expect(storage.body).toMatchObject({ status: 'down', services: { database: 'up', objectStorage: 'down' } });
    expect((await noStorage.get('/api/health/live')).body).toEqual({ status: 'up' });
  });

  it('stays ready without mail (mail waits in the job queue), and says mail is down', async () => {
    const res = await noMail.get('/api/health/ready');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'up', services: { database: 'up', objectStorage: 'up', mail: 'down' } });
  });
});
