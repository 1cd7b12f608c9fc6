// The ability cache (ability-cache.ts): one ability per session user's role, practice and shares,
// and never a stale one: a changed role or a revoked share misses and is built afresh.
import { type AbilityUser, type ActiveShare, subject } from '@torquetrail/authz';
import { describe, expect, it } from 'vitest';
import { AbilityCache } from './ability-cache.js';

const PRACTICE = '00000000-0000-4000-8000-000000000001';
const OTHER_PRACTICE = '00000000-0000-4000-8000-000000000002';
const PATIENT = '00000000-0000-4000-8000-0000000000a1';
const SITE = '00000000-0000-4000-8000-0000000000b1';
const OTHER_SITE = '00000000-0000-4000-8000-0000000000b2';

const share = (over: Partial<ActiveShare> = {}): ActiveShare => ({
  patientId: PATIENT,
  scopes: ['outcomes'],
  siteIds: [SITE],
  endsOn: null,
  ...over,
});
const surgeon = (shares: ActiveShare[], over: Partial<AbilityUser> = {}): AbilityUser => ({
  id: '00000000-0000-4000-8000-0000000000c1',
  role: 'surgeon',
  practiceId: OTHER_PRACTICE,
  sharedPatientIds: [...new Set(shares.map((s) => s.patientId))],
  shares,
  ...over,
});
const sharedSite = (id: string) => subject('ImplantSite', { id, patientId: PATIENT, practiceId: PRACTICE });
const ownPatient = subject('Patient', { id: PATIENT, practiceId: PRACTICE });

describe('AbilityCache', () => {
  it('gives the same ability back while the user is loaded the same', () => {
    const cache = new AbilityCache();
    const first = cache.abilityFor(surgeon([share()]));
    // A new object with equal content, as each request loads the user anew.
    expect(cache.abilityFor(surgeon([share()]))).toBe(first);
    expect(cache.count).toBe(1);
  });

  it('a revoked share is gone from the very next ability', () => {
    const cache = new AbilityCache();
    expect(cache.abilityFor(surgeon([share()])).can('read', sharedSite(SITE))).toBe(true);
    const revoked = cache.abilityFor(surgeon([]));
    expect(revoked.can('read', sharedSite(SITE))).toBe(false);
  });

  it("a share's sites, scope or end changed: a new ability", () => {
    const cache = new AbilityCache();
    const before = cache.abilityFor(surgeon([share()]));
    const otherSites = cache.abilityFor(surgeon([share({ siteIds: [OTHER_SITE] })]));
    expect(otherSites).not.toBe(before);
    expect(otherSites.can('read', sharedSite(SITE))).toBe(false);
    expect(otherSites.can('read', sharedSite(OTHER_SITE))).toBe(true);
    const placement = cache.abilityFor(surgeon([share({ scopes: ['placement'] })]));
    expect(placement).not.toBe(before);
    expect(placement.can('create', subject('Placement', { patientId: PATIENT, siteId: SITE }))).toBe(true);
    expect(before.can('create', subject('Placement', { patientId: PATIENT, siteId: SITE }))).toBe(false);
    expect(cache.abilityFor(surgeon([share({ endsOn: '2030-01-01' })]))).not.toBe(before);
  });

  it('a changed role or practice is honoured at once', () => {
    const cache = new AbilityCache();
    const dentist = surgeon([], { role: 'dentist', practiceId: PRACTICE });
    expect(cache.abilityFor(dentist).can('create', 'Patient')).toBe(true);
    const hygienist = cache.abilityFor({ ...dentist, role: 'hygienist' });
    expect(hygienist.can('create', 'Patient')).toBe(false);
    expect(hygienist.can('read', ownPatient)).toBe(true);
    const moved = cache.abilityFor({ ...dentist, practiceId: OTHER_PRACTICE });
    expect(moved.can('read', ownPatient)).toBe(false);
  });

  it('keeps at most its size, dropping the least recently used', () => {
    const cache = new AbilityCache(2);
    const user = (n: number) => surgeon([], { id: `00000000-0000-4000-8000-00000000000${n}` });
    const one = cache.abilityFor(user(1));
    const two = cache.abilityFor(user(2));
    expect(cache.abilityFor(user(1))).toBe(one);
    cache.abilityFor(user(3));
    expect(cache.count).toBe(2);
    // 2 was the least recently used: built again; 1 stayed.
    expect(cache.abilityFor(user(1))).toBe(one);
    expect(cache.abilityFor(user(2))).not.toBe(two);
  });
});
