import { and, isNull, or, sql, type SQL } from 'drizzle-orm';
import { patientShares } from './schema/index.js';

/**
 * A share that still opens its patient: not revoked, and its end date (inclusive, a UTC calendar
 * day) not yet passed. The one definition for the session's shares and the shares' status.
 */
export function liveShare(): SQL {
  return and(
    isNull(patientShares.revokedAt),
    or(isNull(patientShares.endsOn), sql`${patientShares.endsOn} >= (now() at time zone 'utc')::date`),
  )!;
}
