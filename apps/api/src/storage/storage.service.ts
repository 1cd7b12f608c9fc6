import { Inject, Injectable, type OnModuleDestroy } from '@nestjs/common';
import type { Readable } from 'node:stream';
import {
  AbortMultipartUploadCommand,
  CompleteMultipartUploadCommand,
  CreateMultipartUploadCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  PutObjectCommand,
  S3Client,
  UploadPartCommand,
} from '@aws-sdk/client-s3';
import { StorageUnavailableError } from '../common/unavailable.js';
import { ENV, type Env } from '../config/env.js';

/** Size of a multipart upload's parts: S3's smallest (all but the last part must be at least this). */
const PART_BYTES = 5 * 1024 * 1024;

/**
 * An error S3 answered with a client status (404 no such key, 403 …) is the caller's to handle;
 * no answer at all (refused, reset, timed out) or a server error means S3 is away, answered 503.
 */
function asUnavailable(error: unknown): unknown {
  const status = (error as { $metadata?: { httpStatusCode?: number } } | null)?.$metadata?.httpStatusCode;
  return typeof status === 'number' && status < 500 ? error : new StorageUnavailableError(error);
}

/**
 * Files (lab prescriptions, radiographs) go to S3 through the AWS SDK. Locally the endpoint is the
 * s3rver fake in minio-local/; path-style addressing, and checksums only where required, because
 * the fake does not understand the SDK's default chunked checksum framing.
 */
@Injectable()
export class StorageService implements OnModuleDestroy {
  readonly client: S3Client;
  readonly bucket: string;

  constructor(@Inject(ENV) env: Env) {
    this.bucket = env.S3_BUCKET;
    this.client = new S3Client({
      endpoint: env.S3_ENDPOINT,
      region: env.S3_REGION,
      credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
      forcePathStyle: true,
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
      maxAttempts: 2,
      // A stopped or hung S3 answers the request 503 within seconds instead of holding it open.
      requestHandler: { connectionTimeout: 3000, requestTimeout: 20_000 },
    });
  }

  async isUp(): Promise<boolean> {
    try {
      await this.client.send(new HeadBucketCommand({ Bucket: this.bucket }), {
        abortSignal: AbortSignal.timeout(2000),
      });
      return true;
    } catch {
      return false;
    }
  }

  async put(key: string, body: Buffer, contentType: string): Promise<void> {
    try {
      await this.client.send(
        new PutObjectCommand({ Bucket: this.bucket, Key: key, Body: body, ContentType: contentType }),
      );
    } catch (error) {
      throw asUnavailable(error);
    }
  }

  async get(key: string): Promise<Buffer> {
    try {
      const out = await this.client.send(new GetObjectCommand({ Bucket: this.bucket, Key: key }));
      if (!out.Body) throw new Error(`object ${key} has no body`);
      return Buffer.from(await out.Body.transformToByteArray());
    } catch (error) {
      throw asUnavailable(error);
    }
  }

  /** Removes an object written for a row that could not be recorded (no orphan files). */
  async delete(key: string): Promise<void> {
    try {
      await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: key }));
    } catch (error) {
      throw asUnavailable(error);
    }
  }

  /**
   * Streams a body of unknown length to S3 as a multipart upload of 5 MB parts (S3's smallest),
   * filling one part buffer, reused for every part of the upload: memory stays at one part per
   * upload whatever the size, and no part-sized garbage is left for the collector. (The SDK's
   * lib-storage Upload gathers each part as a list of chunks, copies it into a new buffer and keeps
   * the previous one alive until the next: up to three parts per upload, which took five parallel
   * 50 MB uploads over 64 MB of growth — scripts/bench-radiograph-upload.mjs, ADR 0007.) A body shorter than
   * one part is a single PutObject. When the body or S3 fails, the multipart upload is aborted (its
   * parts removed) and the body's error, if it had one, is the one thrown.
   */
  async putStream(key: string, body: Readable, contentType: string): Promise<void> {
    const part = Buffer.allocUnsafe(PART_BYTES);
    let filled = 0;
    let uploadId: string | undefined;
    const parts: { ETag: string | undefined; PartNumber: number }[] = [];
    const sendPart = async () => {
      uploadId ??= (
        await this.client.send(
          new CreateMultipartUploadCommand({ Bucket: this.bucket, Key: key, ContentType: contentType }),
        )
      ).UploadId;
      const PartNumber = parts.length + 1;
      const out = await this.client.send(
        new UploadPartCommand({
          Bucket: this.bucket,
          Key: key,
          UploadId: uploadId,
          PartNumber,
          Body: part.subarray(0, filled),
        }),
      );
      parts.push({ ETag: out.ETag, PartNumber });
      filled = 0;
    };
    let bodyError: unknown = null;
    try {
      const chunks = (body as AsyncIterable<Buffer>)[Symbol.asyncIterator]();
      for (;;) {
        const next = await chunks.next().catch((error: unknown) => {
          bodyError = error ?? new Error('the body failed');
          throw bodyError;
        });
        if (next.done) break;
        const chunk = next.value;
        for (let at = 0; at < chunk.length;) {
          const n = chunk.copy(part, filled, at);
          filled += n;
          at += n;
          if (filled === PART_BYTES) await sendPart();
        }
      }
      if (uploadId === undefined) {
        await this.client.send(
          new PutObjectCommand({
            Bucket: this.bucket,
            Key: key,
            Body: part.subarray(0, filled),
            ContentType: contentType,
          }),
        );
        return;
      }
      if (filled > 0) await sendPart();
      await this.client.send(
        new CompleteMultipartUploadCommand({
          Bucket: this.bucket,
          Key: key,
          UploadId: uploadId,
          MultipartUpload: { Parts: parts },
        }),
      );
      uploadId = undefined;
    } catch (error) {
      if (uploadId !== undefined) {
        await this.client
          .send(new AbortMultipartUploadCommand({ Bucket: this.bucket, Key: key, UploadId: uploadId }))
          .catch(() => undefined); // parts left behind are the bucket's lifecycle rule's to expire
      }
      throw bodyError ? error : asUnavailable(error);
    }
  }

  /** The object as a stream, for answering a download without holding it in memory. */
  async getStream(key: string): Promise<Readable> {
    try {
      const out = await this.client.send(new GetObjectCommand({ Bucket: this.bucket, Key: key }));
      if (!out.Body) throw new Error(`object ${key} has no body`);
      return out.Body as Readable;
    } catch (error) {
      throw asUnavailable(error);
    }
  }

  onModuleDestroy(): void {
    this.client.destroy();
  }
}
