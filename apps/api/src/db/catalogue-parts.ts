import { and, eq, inArray } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { isCurrentVersion } from './amendments.js';
import type { Db } from './database.js';
import { components, torqueWrenches } from './schema/index.js';

/** What a catalogue part is, as every feature that shows or checks parts selects it (catalogue, restorations). */
export const componentSpecColumns = {
  id: components.id,
  platformId: components.platformId,
  kind: components.kind,
  name: components.name,
  referenceCode: components.referenceCode,
  engaging: components.engaging,
  angleDeg: components.angleDeg,
  collarHeightMm: components.collarHeightMm,
  maxDivergenceDeg: components.maxDivergenceDeg,
  retentionLabel: components.retentionLabel,
  retentionN: components.retentionN,
  tray: components.tray,
  copingLevel: components.copingLevel,
  torqueSpecNcm: components.torqueSpecNcm,
  tolerancePct: components.tolerancePct,
  requiresLot: components.requiresLot,
};

/**
 * New work uses the current version of a part (ADR 0006): each id, of any version of a part in
 * the practice's catalogue, resolves to the part's current version (`askedId` is the id given).
 * Ids of another practice's catalogue are simply not found.
 */
export async function currentPartVersions(db: Db, practiceId: string, ids: string[]) {
  if (ids.length === 0) return [];
  const asked = alias(components, 'asked');
  return db
    .select({ askedId: asked.id, ...componentSpecColumns })
    .from(asked)
    .innerJoin(components, and(eq(components.lineageId, asked.lineageId), isCurrentVersion(components)))
    .where(and(eq(asked.practiceId, practiceId), inArray(asked.id, ids)));
}

/** The current version of a torque wrench named by the id of any of its versions, within one practice. */
export async function currentWrenchVersion(db: Db, practiceId: string, id: string) {
  const asked = alias(torqueWrenches, 'asked');
  const [row] = await db
    .select({ id: torqueWrenches.id, lineageId: torqueWrenches.lineageId })
    .from(asked)
    .innerJoin(torqueWrenches, and(eq(torqueWrenches.lineageId, asked.lineageId), isCurrentVersion(torqueWrenches)))
    .where(and(eq(asked.practiceId, practiceId), eq(asked.id, id)));
  return row ?? null;
}
