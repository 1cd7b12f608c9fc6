// A data step the migration runner takes after the SQL migrations: placements recorded before
// placements.gtin existed (migration 0018) kept their GTIN only inside the UDI string, where the
// lot look-up's index cannot find it. The GTIN is read with parseUdi, the same parser the
// placement service uses when it records one, so an old row and a new one carry the same value.
// Idempotent: only rows with a UDI and no GTIN are read, and a UDI parseUdi refuses stays as it is.
// Then the catalogue learns the system of every GTIN placed so far (db/system-gtins.ts).
import { parseUdi, UdiError } from '@torquetrail/domain';
import { and, eq, gt, isNotNull, isNull } from 'drizzle-orm';
import type { Db } from './database.js';
import { placements } from './schema/index.js';
import { learnSystemGtinsOfPlacements } from './system-gtins.js';

const BATCH = 500;

function gtinOf(udi: string): string | null {
  try {
    return parseUdi(udi).gtin;
  } catch (error) {
    if (error instanceof UdiError) return null;
    throw error;
  }
}

/** Fills placements.gtin from the recorded UDI where it is missing; returns how many rows gained one. */
export async function backfillPlacementGtins(db: Db): Promise<number> {
  let filled = 0;
  let after = '00000000-0000-0000-0000-000000000000';
  for (;;) {
    const rows = await db
      .select({ id: placements.id, udi: placements.udi })
      .from(placements)
      .where(and(isNull(placements.gtin), isNotNull(placements.udi), gt(placements.id, after)))
      .orderBy(placements.id)
      .limit(BATCH);
    for (const row of rows) {
      const gtin = row.udi ? gtinOf(row.udi) : null;
      if (!gtin) continue;
      await db.update(placements).set({ gtin }).where(eq(placements.id, row.id));
      filled++;
    }
    if (rows.length < BATCH) break;
    after = rows[rows.length - 1].id;
  }
  // Placements recorded before the catalogue learned GTINs (and those just filled) teach it too.
  await learnSystemGtinsOfPlacements(db);
  return filled;
}
