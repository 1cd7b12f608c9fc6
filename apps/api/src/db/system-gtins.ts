// The catalogue learns which implant system a GTIN belongs to from the placements that carry it:
// the first placement of a GTIN in a practice names its system (an administrator's entry, made
// before or after, is never replaced by a learned one). Shared by the placement writes, the seed
// and the GTIN backfill, so every way a placement gains a GTIN teaches the catalogue alike.
import { sql } from 'drizzle-orm';
import type { Db } from './database.js';
import { placements, platforms, systemGtins } from './schema/index.js';

/** Records the system of `gtin` from the placement's platform unless the practice knows it already. */
export async function learnSystemGtin(
  db: Db,
  v: { practiceId: string; platformId: string; gtin: string | null },
): Promise<void> {
  if (!v.gtin) return;
  await db.execute(sql`
    insert into ${systemGtins} (practice_id, system_id, gtin)
    select ${v.practiceId}, ${platforms.systemId}, ${v.gtin} from ${platforms} where ${platforms.id} = ${v.platformId}
    on conflict (practice_id, gtin) do nothing`);
}

/**
 * The same for every placement at once (the migration runner's data step): each GTIN's system is
 * that of its earliest recorded placement in the practice; what the practice knows already stays.
 */
export async function learnSystemGtinsOfPlacements(db: Db): Promise<void> {
  await db.execute(sql`
    insert into ${systemGtins} (practice_id, system_id, gtin)
    select distinct on (p.practice_id, p.gtin) p.practice_id, pf.system_id, p.gtin
    from ${placements} p join ${platforms} pf on pf.id = p.platform_id
    where p.gtin is not null
    order by p.practice_id, p.gtin, p.recorded_at, p.id
    on conflict (practice_id, gtin) do nothing`);
}
