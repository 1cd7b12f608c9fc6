import { describe, expect, it } from 'vitest';
import { idleSignInPath, safeReturnPath, signInPath } from './return-path';

describe('signInPath', () => {
  it('remembers the wanted page, but not the default one', () => {
    expect(signInPath('/patients/abc?x=1')).toBe('/sign-in?from=%2Fpatients%2Fabc%3Fx%3D1');
    expect(signInPath('/patients')).toBe('/sign-in');
    expect(signInPath('/')).toBe('/sign-in');
  });
});

describe('idleSignInPath', () => {
  it('adds why the session ended to the sign-in page, with or without a page to go back to', () => {
    expect(idleSignInPath('/recalls')).toBe('/sign-in?from=%2Frecalls&reason=idle');
    expect(idleSignInPath('/patients')).toBe('/sign-in?reason=idle');
  });
});

describe('safeReturnPath', () => {
  it('follows paths inside the app', () => {
    expect(safeReturnPath('/patients/abc')).toBe('/patients/abc');
  });
  it('refuses other hosts, absolute URLs and loops back to sign-in', () => {
    for (const raw of [
      null,
      '',
      'https://evil.test',
      '//evil.test/x',
      '/\\evil.test',
      'patients',
      '/sign-in?from=/x',
    ]) {
      expect(safeReturnPath(raw)).toBe('/patients');
    }
  });
});
