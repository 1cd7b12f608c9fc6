// The one password rule of Torquetrail, used by the API (every route that sets a password) and
// by the web (the same messages beside the field). NIST SP 800-63B §5.1.1.2: a length floor,
// no composition rules, and a check against values known to be commonly used; OWASP ASVS 2.1.1
// and 2.1.7 (at least 12 characters, checked against breached or common passwords).
import { z } from 'zod';
import { COMMON_PASSWORDS_TEXT } from './common-passwords.js';

export const PASSWORD_MIN_LENGTH = 12;
export const PASSWORD_MAX_LENGTH = 200;

const COMMON = new Set(COMMON_PASSWORDS_TEXT.split(/\s+/).filter(Boolean));

export const PASSWORD_MESSAGES = {
  tooShort: `Use at least ${PASSWORD_MIN_LENGTH} characters`,
  tooLong: `Use at most ${PASSWORD_MAX_LENGTH} characters`,
  common: 'This password is one of the most commonly used ones: choose another',
  localPart: 'The password must not contain the part of your e-mail address before the @',
} as const;

/** The shortest repeating unit of `s` ("abcabc" → "abc"), or `s` itself. */
function repeatedUnit(s: string): string {
  for (let size = 1; size <= s.length / 2; size += 1) {
    if (s.length % size === 0 && s.slice(0, size).repeat(s.length / size) === s) return s.slice(0, size);
  }
  return s;
}

/**
 * Whether the password is a common one: as it is, or once its digits, spaces and symbols are set
 * aside ("Password2024!", "pass word 123456"), or repeated ("letmein-letmein", "qwertyqwerty").
 */
export function isCommonPassword(password: string): boolean {
  const lower = password.toLowerCase();
  if (COMMON.has(lower) || COMMON.has(repeatedUnit(lower))) return true;
  const letters = lower.replace(/[^a-z]/g, '');
  return letters.length >= 4 && (COMMON.has(letters) || COMMON.has(repeatedUnit(letters)));
}

/**
 * What is wrong with a new password, or null. `email` is the account's address: a password that
 * contains its local part (3 characters or more) is the first thing an attacker tries.
 */
export function passwordProblem(password: string, email?: string): string | null {
  if (password.length < PASSWORD_MIN_LENGTH) return PASSWORD_MESSAGES.tooShort;
  if (password.length > PASSWORD_MAX_LENGTH) return PASSWORD_MESSAGES.tooLong;
  if (isCommonPassword(password)) return PASSWORD_MESSAGES.common;
  const local = email?.split('@')[0]?.toLowerCase() ?? '';
  if (local.length >= 3 && password.toLowerCase().includes(local)) return PASSWORD_MESSAGES.localPart;
  return null;
}

/** A new password without the e-mail check (bodies that do not carry the address). */
export const NewPassword = z.string({ error: 'Enter a password' }).superRefine((value, ctx) => {
  const problem = passwordProblem(value);
  if (problem) ctx.addIssue({ code: 'custom', message: problem });
});

/** Adds the e-mail check to a body's password field, at `path`, when the address is known. */
export function refinePasswordWithEmail<S extends z.ZodObject>(
  schema: S,
  pick: (body: z.output<S>) => { password: string; email: string | undefined },
  path: string,
): S {
  return schema.superRefine((body, ctx) => {
    const { password, email } = pick(body);
    const problem = passwordProblem(password, email);
    if (problem === PASSWORD_MESSAGES.localPart) ctx.addIssue({ code: 'custom', message: problem, path: [path] });
  });
}
