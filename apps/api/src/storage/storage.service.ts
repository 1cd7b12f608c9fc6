import { Inject, Injectable, type OnModuleDestroy } from '@nestjs/common';
import type { Readable } from 'node:stream';
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import { StorageUnavailableError } from '../common/unavailable.js';
import { Upload } from '@aws-sdk/lib-storage';
import { ENV, type Env } from '../config/env.js';

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
   * Streams a body of unknown length to S3 in 5 MB parts (S3's smallest), so memory stays bounded
   * whatever the size; a failed or aborted upload removes its parts. One part in flight per upload:
   * the SDK gathers a part as a list of chunks and then copies it into one buffer, so each part
   * in flight costs about 10 MB at its peak; with two, five parallel 50 MB uploads grew the API by
   * more than 64 MB (scripts/bench-radiograph-upload.mjs), and parallel uploads keep S3 busy anyway.
   */
  async putStream(key: string, body: Readable, contentType: string): Promise<void> {
    const upload = new Upload({
      client: this.client,
      params: { Bucket: this.bucket, Key: key, Body: body, ContentType: contentType },
      queueSize: 1,
      partSize: 5 * 1024 * 1024,
      leavePartsOnError: false,
    });
    try {
      await upload.done();
    } catch (error) {
      throw asUnavailable(error);
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
