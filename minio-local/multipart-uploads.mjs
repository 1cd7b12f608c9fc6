// What s3rver leaves out of multipart uploads, added in front of its router: AbortMultipartUpload
// (DELETE /<bucket>/<key>?uploadId=…, which s3rver answers 405, leaving the parts on disk) and
// ListMultipartUploads (GET /<bucket>?uploads, 501 in s3rver), and NoSuchUpload for a part sent
// to an upload that does not exist (s3rver would start one for it), so that an upload the API gives up
// (cancelled, over the size limit, S3 failing mid-way) leaves no parts behind, as on S3, and tests
// can see so through the SDK. Path-style requests only, as the API sends them. s3rver keeps an
// upload in <bucket>/._S3rver_uploads/<uploadId>/ with its key in the file `key`.
import fs from 'node:fs/promises';
import path from 'node:path';

const UPLOAD_ID = /^[0-9a-f]{32}$/; // s3rver's: 16 random bytes in hex

const xmlEscape = (s) => s.replace(/[<>&'"]/g, (c) => `&#${c.charCodeAt(0)};`);

function s3Error(ctx, status, code, message) {
  ctx.status = status;
  ctx.type = 'application/xml';
  ctx.body = `<?xml version="1.0" encoding="UTF-8"?>\n<Error><Code>${code}</Code><Message>${xmlEscape(message)}</Message></Error>`;
}

/** The multipart uploads of a bucket in progress: [{ uploadId, key, initiated }]. */
async function uploadsOf(store, bucket) {
  const dir = store.getResourcePath(bucket, undefined, 'uploads');
  const ids = await fs.readdir(dir).catch(() => []);
  const uploads = [];
  for (const uploadId of ids.filter((id) => UPLOAD_ID.test(id))) {
    const key = await fs.readFile(path.join(dir, uploadId, 'key'), 'utf8').catch(() => null);
    const { birthtime } = await fs.stat(path.join(dir, uploadId));
    if (key !== null) uploads.push({ uploadId, key, initiated: birthtime });
  }
  return uploads.sort((a, b) => a.key.localeCompare(b.key) || a.uploadId.localeCompare(b.uploadId));
}

/** Koa middleware for an s3rver instance (`server.store` is its filesystem store). */
export function multipartUploads(server) {
  return async (ctx, next) => {
    const [, bucket, ...keyParts] = ctx.path.split('/');
    const key = keyParts.map(decodeURIComponent).join('/');
    const abort = ctx.method === 'DELETE' && key && 'uploadId' in ctx.query;
    const part = ctx.method === 'PUT' && key && 'uploadId' in ctx.query;
    const list = ctx.method === 'GET' && bucket && !key && 'uploads' in ctx.query;
    if (!abort && !part && !list) return next();
    if (!(await server.store.getBucket(bucket)))
      return s3Error(ctx, 404, 'NoSuchBucket', 'The specified bucket does not exist');

    if (list) {
      const prefix = String(ctx.query.prefix ?? '');
      const uploads = (await uploadsOf(server.store, bucket)).filter((u) => u.key.startsWith(prefix));
      ctx.type = 'application/xml';
      ctx.body = `<?xml version="1.0" encoding="UTF-8"?>\n<ListMultipartUploadsResult><Bucket>${xmlEscape(bucket)}</Bucket><Prefix>${xmlEscape(prefix)}</Prefix><IsTruncated>false</IsTruncated>${uploads
        .map(
          (u) =>
            `<Upload><Key>${xmlEscape(u.key)}</Key><UploadId>${u.uploadId}</UploadId><Initiated>${u.initiated.toISOString()}</Initiated></Upload>`,
        )
        .join('')}</ListMultipartUploadsResult>`;
      return undefined;
    }

    const uploadId = String(ctx.query.uploadId);
    const dir = path.join(server.store.getResourcePath(bucket, undefined, 'uploads'), uploadId);
    const storedKey = UPLOAD_ID.test(uploadId)
      ? await fs.readFile(path.join(dir, 'key'), 'utf8').catch(() => null)
      : null;
    if (storedKey !== key) {
      // The part's body is left unread: the answer is sent and the connection closed.
      if (part) ctx.set('Connection', 'close');
      return s3Error(ctx, 404, 'NoSuchUpload', 'The specified multipart upload does not exist');
    }
    if (part) return next();
    await fs.rm(dir, { recursive: true, force: true });
    ctx.status = 204;
    return undefined;
  };
}
