// An SDK client straight to the tests' S3 fake (never through a proxy), for checking what the API
// left in storage; the caller destroys it.
import { S3Client } from '@aws-sdk/client-s3';
import { testEnv } from './test-app.js';

export function testS3Client(): { s3: S3Client; bucket: string } {
  const env = testEnv();
  const s3 = new S3Client({
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
    forcePathStyle: true,
  });
  return { s3, bucket: env.S3_BUCKET };
}
