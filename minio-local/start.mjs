// The local S3 fake: s3rver (a Node implementation of the S3 API) on 127.0.0.1.
// The API only ever reaches it through @aws-sdk/client-s3 with the endpoint from configuration.
// Usage: node minio-local/start.mjs   (started in the background by `npm run services:start`)
import fs from 'node:fs';
import S3rver from 's3rver';
import { host, s3 } from '../scripts/lib/config.mjs';
import { multipartUploads } from './multipart-uploads.mjs';

fs.mkdirSync(s3.dataDir, { recursive: true });

const server = new S3rver({
  address: host,
  port: s3.port,
  directory: s3.dataDir,
  silent: true,
  // Buckets exist from the first start; s3rver keeps existing ones and their objects.
  configureBuckets: [{ name: s3.bucket }, { name: s3.testBucket }],
});

// Before s3rver's router (its last middleware), so the router never answers these 405 or 501.
server.middleware.splice(server.middleware.length - 1, 0, multipartUploads(server));

await server.run();
console.log(
  `[s3] s3rver listening on http://${host}:${s3.port} (data ${s3.dataDir}); buckets ${s3.bucket}, ${s3.testBucket}`,
);

const shutdown = async () => {
  await server.close();
  process.exit(0);
};
process.on('SIGTERM', () => void shutdown());
process.on('SIGINT', () => void shutdown());
