// A time-limited download link for one scan file, mailed to the lab when the files are too large
// to attach. A signed app link rather than a presigned S3 URL: the object store need not be
// reachable from outside (the S3 fake, a private bucket), each download goes through the app and
// writes its audit row, and the expiry is the app's own check, tested without waiting for it.
// Stateless: HMAC-SHA256 over the file's id and the expiry, with a key derived from JWT_SECRET.
import { createHmac, timingSafeEqual } from 'node:crypto';

/** Above this many bytes of scan files, the lab mail carries links instead of the files. */
export const LAB_MAIL_ATTACHMENT_LIMIT_BYTES = 8_000_000;
/** How long a mailed link works: long enough for a lab to fetch the files after a weekend. */
export const LAB_FILE_LINK_TTL_MS = 7 * 24 * 3_600_000;

const keyOf = (secret: string) => createHmac('sha256', secret).update('lab-file-link:v1').digest();
const mac = (secret: string, payload: string) => createHmac('sha256', keyOf(secret)).update(payload).digest();

/** The token of a link to `scanFileId` that works until `expiresAt`. */
export function signLabFileLink(secret: string, scanFileId: string, expiresAt: Date): string {
  const payload = `${scanFileId}.${Math.floor(expiresAt.getTime() / 1000)}`;
  return `${Buffer.from(payload).toString('base64url')}.${mac(secret, payload).toString('base64url')}`;
}

export type LabFileLinkCheck =
  | { ok: true; scanFileId: string; expiresAt: Date }
  | { ok: false; reason: 'invalid' | 'expired' };

/** The file a token opens, if its signature holds and it has not expired at `now`. */
export function verifyLabFileLink(secret: string, token: string, now: Date): LabFileLinkCheck {
  const [encoded, signature, extra] = token.split('.');
  if (!encoded || !signature || extra !== undefined) return { ok: false, reason: 'invalid' };
  const payload = Buffer.from(encoded, 'base64url').toString();
  const expected = mac(secret, payload);
  const given = Buffer.from(signature, 'base64url');
  if (given.length !== expected.length || !timingSafeEqual(given, expected)) return { ok: false, reason: 'invalid' };
  const match = /^([0-9a-f-]{36})\.(\d+)$/.exec(payload);
  if (!match) return { ok: false, reason: 'invalid' };
  const expiresAt = new Date(Number(match[2]) * 1000);
  if (now.getTime() >= expiresAt.getTime()) return { ok: false, reason: 'expired' };
  return { ok: true, scanFileId: match[1], expiresAt };
}
