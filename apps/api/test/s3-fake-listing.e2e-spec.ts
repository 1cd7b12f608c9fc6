// The local S3 fake lists a prefix of more than 1 000 keys page by page, as S3 does: the backup
// reads the whole bucket so, and the tests list what an upload left behind. s3rver writes the
// continuation token with DES, which needs OpenSSL's legacy provider (scripts/services.mjs starts
// the fake with it); without it the second page is never reached and the listing fails with a 500.
import { randomUUID } from 'node:crypto';
import {
  DeleteObjectsCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  paginateListObjectsV2,
} from '@aws-sdk/client-s3';
import { afterAll, describe, expect, it } from 'vitest';
import { testS3Client } from './support/s3-client.js';

const { s3, bucket: Bucket } = testS3Client();
const prefix = `listing-check/${randomUUID()}/`;
const KEYS = 1_005; // one page is 1 000 keys
const keys = Array.from({ length: KEYS }, (_, i) => `${prefix}${String(i).padStart(4, '0')}.txt`);

afterAll(async () => {
  for (let i = 0; i < keys.length; i += 500) {
    await s3.send(
      new DeleteObjectsCommand({ Bucket, Delete: { Objects: keys.slice(i, i + 500).map((Key) => ({ Key })) } }),
    );
  }
  s3.destroy();
});

describe('the S3 fake', () => {
  it('lists more than one page of keys with continuation tokens', async () => {
    for (let i = 0; i < keys.length; i += 25) {
      await Promise.all(keys.slice(i, i + 25).map((Key) => s3.send(new PutObjectCommand({ Bucket, Key, Body: Key }))));
    }
    const first = await s3.send(new ListObjectsV2Command({ Bucket, Prefix: prefix }));
    expect(first.KeyCount).toBe(1_000);
    expect(first.IsTruncated).toBe(true);
    expect(first.NextContinuationToken).toBeTruthy();

    const listed: string[] = [];
    for await (const page of paginateListObjectsV2({ client: s3 }, { Bucket, Prefix: prefix })) {
      listed.push(...(page.Contents ?? []).map((o) => o.Key ?? ''));
    }
    expect(listed).toEqual(keys);
  }, 120_000);
});
