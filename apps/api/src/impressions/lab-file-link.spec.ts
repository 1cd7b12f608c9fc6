// The lab's download link: signed, bound to one file, refused once expired (the clock is a
// parameter: no timed test) and when any character of it is changed.
import { describe, expect, it } from 'vitest';
import { signLabFileLink, verifyLabFileLink } from './lab-file-link.js';

const secret = 'a-test-secret-of-at-least-32-characters!';
const fileId = '0b7c1d2e-3f40-4a5b-8c6d-7e8f90a1b2c3';
const expiresAt = new Date('2026-12-09T12:00:00.000Z');

describe('lab file link', () => {
  it('opens its file until the expiry, and not from that second on', () => {
    const token = signLabFileLink(secret, fileId, expiresAt);
    expect(verifyLabFileLink(secret, token, new Date('2026-12-09T11:59:59.000Z'))).toEqual({
      ok: true,
      scanFileId: fileId,
      expiresAt,
    });
    expect(verifyLabFileLink(secret, token, expiresAt)).toEqual({ ok: false, reason: 'expired' });
  });

  it('is refused when signed with another secret or altered anywhere', () => {
    const token = signLabFileLink(secret, fileId, expiresAt);
    const before = new Date('2026-12-01T00:00:00.000Z');
    expect(verifyLabFileLink(`${secret}x`, token, before)).toEqual({ ok: false, reason: 'invalid' });
    // A later expiry put in the payload does not carry the old signature.
    const [, signature] = token.split('.');
    const stretched = `${Buffer.from(`${fileId}.${Math.floor(Date.UTC(2030, 0, 1) / 1000)}`).toString('base64url')}.${signature}`;
    expect(verifyLabFileLink(secret, stretched, before)).toEqual({ ok: false, reason: 'invalid' });
    expect(verifyLabFileLink(secret, `${token}x`, before)).toEqual({ ok: false, reason: 'invalid' });
    expect(verifyLabFileLink(secret, 'not-a-token', before)).toEqual({ ok: false, reason: 'invalid' });
  });
});
