// The real backing services: PostgreSQL, the S3 fake through the AWS SDK, SMTP to the catcher.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MailService } from '../src/mail/mail.service.js';
import { StorageService } from '../src/storage/storage.service.js';
import { startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());

const mailHttp = `http://127.0.0.1:${process.env.TT_MAIL_HTTP_PORT ?? 2580}/messages`;

describe('health', () => {
  it('reports database, object storage and mail as up (public route)', async () => {
    const res = await ctx.http.get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'up', services: { database: 'up', objectStorage: 'up', mail: 'up' } });
  });
});

describe('object storage through @aws-sdk/client-s3', () => {
  it('round-trips the bytes of a binary object', async () => {
    const storage = ctx.app.get(StorageService);
    const bytes = Buffer.from(Array.from({ length: 70_000 }, (_, i) => (i * 7919) % 256));
    const key = `tests/${randomUUID()}.bin`;
    await storage.put(key, bytes, 'application/octet-stream');
    expect((await storage.get(key)).equals(bytes)).toBe(true);
  });
});

describe('mail over SMTP to the local catcher', () => {
  it('delivers a message that the catcher keeps', async () => {
    const mail = ctx.app.get(MailService);
    const subject = `Torquetrail test ${randomUUID()}`;
    await mail.send({ to: 'lab@dental-lab.example', subject, text: 'Hello from the tests' });
    const messages = (await (await fetch(mailHttp)).json()) as {
      subject: string;
      envelopeTo: string[];
      text: string;
    }[];
    const found = messages.find((m) => m.subject === subject);
    expect(found).toBeDefined();
    expect(found!.envelopeTo).toEqual(['lab@dental-lab.example']);
    expect(found!.text.trim()).toBe('Hello from the tests');
  });
});

describe('OpenAPI document (development and test only)', () => {
  it('lists every documented route', async () => {
    const res = await ctx.http.get('/api/docs/openapi.json');
    expect(res.status).toBe(200);
    expect(Object.keys(res.body.paths)).toEqual(
      expect.arrayContaining(['/api/patients', '/api/patients/{id}', '/api/sites/{id}', '/api/auth/sign-in']),
    );
  });
});
