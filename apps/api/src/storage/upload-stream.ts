import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import type { StorageService } from './storage.service.js';

/** How much of the start of a file is read before deciding its type and parsing a DICOM header. */
export const HEADER_BYTES = 1024 * 1024;

export class TooLarge extends Error {}

/**
 * Reads the first `HEADER_BYTES` of a request body (or all of it, when shorter), then hands back a
 * stream of the whole body that counts and hashes the bytes as they pass and fails with
 * {@link TooLarge} as soon as the limit is crossed, so nothing larger reaches storage.
 */
export async function splitHead(body: AsyncIterable<Buffer>, maxBytes: number) {
  const it = body[Symbol.asyncIterator]();
  const chunks: Buffer[] = [];
  let headLength = 0;
  let ended = false;
  while (headLength < HEADER_BYTES) {
    const next = await it.next();
    if (next.done) {
      ended = true;
      break;
    }
    chunks.push(next.value);
    headLength += next.value.length;
    if (headLength > maxBytes) throw new TooLarge();
  }
  const head = Buffer.concat(chunks);
  const hash = createHash('sha256');
  let size = 0;
  let overLimit = false;
  async function* all(): AsyncGenerator<Buffer> {
    size = head.length;
    hash.update(head);
    yield head;
    if (ended) return;
    for (let next = await it.next(); !next.done; next = await it.next()) {
      size += next.value.length;
      if (size > maxBytes) {
        overLimit = true;
        throw new TooLarge();
      }
      hash.update(next.value);
      yield next.value;
    }
  }
  return {
    head,
    stream: () => Readable.from(all(), { objectMode: false }),
    /**
     * True once the stream failed on the limit: whatever error the storage upload then reports
     * (its own, or one from aborting the multipart upload), the answer is 413.
     */
    overLimit: () => overLimit,
    /** Valid once the stream has ended. */
    result: () => ({ size, sha256: hash.digest('hex') }),
  };
}

/**
 * Streams the split body to object storage under `key`. A body that crosses the limit mid-stream
 * (no Content-Length, or a false one) fails here: the multipart upload is aborted (its parts
 * removed) and `tooLarge` is thrown; any other failure is storage being away (`unavailable`).
 */
export async function putSplit(
  storage: StorageService,
  key: string,
  split: Awaited<ReturnType<typeof splitHead>>,
  contentType: string,
  errors: { tooLarge: () => Error; unavailable: () => Error },
): Promise<void> {
  try {
    await storage.putStream(key, split.stream(), contentType);
  } catch {
    throw split.overLimit() ? errors.tooLarge() : errors.unavailable();
  }
}

/**
 * After an upload route answers: a refused body is drained so the client can read the answer
 * instead of a reset connection. The head was read through an async iterator, whose 'readable'
 * listener would keep resume() from flowing the rest.
 */
export function drainUnread(body: Readable): void {
  if (!body.readableEnded) {
    body.removeAllListeners('readable');
    body.resume();
  }
}

/** Best effort: an object left behind by a failure after the upload is unreferenced, never shown. */
export async function removeQuietly(storage: StorageService, key: string): Promise<void> {
  try {
    await storage.delete(key);
  } catch {
    // nothing more to do: no row points at the object
  }
}
