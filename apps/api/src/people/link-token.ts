import { createHash, randomBytes } from 'node:crypto';

/** 256 random bits as base64url (43 characters): the secret part of a one-time link. */
export const newLinkToken = (): string => randomBytes(32).toString('base64url');

/** Only the token's sha-256 is stored: a copy of the database opens no link. */
export const hashLinkToken = (token: string): string => createHash('sha256').update(token).digest('base64url');

export const INVITATION_VALID_MS = 72 * 3600 * 1000;
export const RESET_VALID_MS = 30 * 60 * 1000;
