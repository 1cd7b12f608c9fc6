import { albrektssonReference, type BoneLevelReading } from '@torquetrail/domain';

/**
 * Bone change since loading: the latest reading minus the reference reading, which is the one
 * closest to the loading date within ±90 days (Albrektsson's reference, albrektssonReference), or
 * else the first reading after loading [decision: series often start at the first recall]. Positive
 * means bone lost. Null without a loading date or without a reading since loading.
 */
export function boneChangeSinceLoading(
  readings: readonly BoneLevelReading[],
  loadedOn: string | null,
): { mm: number; since: string } | null {
  if (!loadedOn || readings.length === 0) return null;
  const ordered = [...readings].sort((a, b) => a.date.localeCompare(b.date));
  const reference = albrektssonReference(ordered, loadedOn) ?? ordered.find((r) => r.date >= loadedOn) ?? null;
  if (!reference) return null;
  const latest = ordered[ordered.length - 1];
  return { mm: Math.round((latest.boneLevelMm - reference.boneLevelMm) * 100) / 100, since: reference.date };
}
