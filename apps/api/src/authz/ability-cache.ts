import { type AbilityUser, type AppAbility, defineAbilityFor } from '@torquetrail/authz';

/** Enough for every person signed in at a practice group at once; a miss only costs a rebuild. */
const ABILITY_CACHE_SIZE = 500;

/**
 * Everything `defineAbilityFor` reads, as one string. The session user is loaded fresh on every
 * request (role, practice and live shares included), so a changed role, a revoked or ended share
 * or a share's new sites give another key, and that very request builds a new ability: the cache
 * can only ever return the ability the same inputs would build again.
 */
function abilityKey(user: AbilityUser): string {
  return JSON.stringify([user.id, user.role, user.practiceId, user.sharedPatientIds, user.shares]);
}

/**
 * The CASL ability of a signed-in user, built once per `abilityKey` instead of on every request
 * (the rules and CASL's index of them came out the same on every request of a session). Least
 * recently used first out, at `size` entries. An ability is never changed once built (nothing calls
 * `update`), so requests may share one.
 */
export class AbilityCache {
  private readonly entries = new Map<string, AppAbility>();

  constructor(private readonly size = ABILITY_CACHE_SIZE) {}

  abilityFor(user: AbilityUser): AppAbility {
    const key = abilityKey(user);
    const cached = this.entries.get(key);
    if (cached) {
      // A Map keeps insertion order: moved to the end, it is the most recently used.
      this.entries.delete(key);
      this.entries.set(key, cached);
      return cached;
    }
    const ability = defineAbilityFor(user);
    this.entries.set(key, ability);
    if (this.entries.size > this.size) this.entries.delete(this.entries.keys().next().value as string);
    return ability;
  }

  /** How many abilities are kept (for tests of the bound). */
  get count(): number {
    return this.entries.size;
  }
}
