// The password rule: NIST SP 800-63B §5.1.1.2 (length floor, a list of commonly used values, no
// composition rules) and OWASP ASVS 2.1.1 / 2.1.7 (12 characters, breached or common passwords).
import { describe, expect, it } from 'vitest';
import { COMMON_PASSWORDS_TEXT } from './common-passwords.js';
import { isCommonPassword, PASSWORD_MESSAGES, passwordProblem } from './password.js';

describe('passwordProblem', () => {
  it('asks for at least 12 characters, and at most 200', () => {
    expect(passwordProblem('Eleven char')).toBe(PASSWORD_MESSAGES.tooShort);
    expect(passwordProblem('Twelve chars')).toBeNull();
    expect(passwordProblem('x'.repeat(201))).toBe(PASSWORD_MESSAGES.tooLong);
  });

  it('refuses common passwords, alone, padded with digits or symbols, spaced out or repeated', () => {
    for (const p of [
      'qwerty123456',
      'administrator',
      'Password2024!',
      '!!Sunshine1234',
      'pass word 12345678',
      'letmein-letmein',
      'qwertyqwerty',
    ])
      expect(passwordProblem(p), p).toBe(PASSWORD_MESSAGES.common);
    expect(isCommonPassword('Tidewater lantern 49')).toBe(false);
  });

  it("refuses a password containing the e-mail address's local part (3 characters or more), in any case", () => {
    expect(passwordProblem('My Maren.Holt password', 'maren.holt@larkspur.example')).toBe(PASSWORD_MESSAGES.localPart);
    expect(passwordProblem('Tidewater lantern 49', 'maren.holt@larkspur.example')).toBeNull();
    expect(passwordProblem('Tidewater lantern 49', 'jo@larkspur.example')).toBeNull();
  });

  it('ships the list it names: every entry one token, none with characters the template would change', () => {
    const words = COMMON_PASSWORDS_TEXT.split(/\s+/).filter(Boolean);
    expect(words.length).toBe(308 + 7284);
    expect(words.every((w) => /^[\x21-\x7e]+$/.test(w))).toBe(true);
  });
});
