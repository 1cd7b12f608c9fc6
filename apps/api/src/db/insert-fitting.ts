// The Stack's retentive inserts and bar clips: a logged insert change (the app's or the demo's)
// takes the insert in place out and installs the new one, as any replaced part is recorded.
import { and, eq, inArray, isNull } from 'drizzle-orm';
import { DENTURE_RETAINER_KINDS } from '@torquetrail/contracts';
import type { Tx } from './database.js';
import { componentInstances, components } from './schema/index.js';

/**
 * Puts a logged insert change into the Stack: the insert in place at the site comes out on the day
 * of the change (its row and history stay) and the new one is installed, replacing it. A change
 * dated before the insert now in place (history typed in later) leaves the Stack as it is.
 * Answers whether the Stack changed.
 */
export async function fitInsert(
  tx: Tx,
  v: {
    practiceId: string;
    patientId: string;
    siteId: string;
    restorationId: string;
    componentId: string;
    changedOn: string;
    recordedBy: string | null;
  },
): Promise<boolean> {
  const inPlace = await tx
    .select({ id: componentInstances.id, installedOn: componentInstances.installedOn })
    .from(componentInstances)
    .innerJoin(components, eq(components.id, componentInstances.componentId))
    .where(
      and(
        eq(componentInstances.siteId, v.siteId),
        isNull(componentInstances.removedOn),
        inArray(components.kind, [...DENTURE_RETAINER_KINDS]),
      ),
    )
    .orderBy(componentInstances.installedOn)
    .for('update', { of: componentInstances });
  if (inPlace.some((p) => p.installedOn > v.changedOn)) return false;
  for (const p of inPlace)
    await tx.update(componentInstances).set({ removedOn: v.changedOn }).where(eq(componentInstances.id, p.id));
  await tx.insert(componentInstances).values({
    practiceId: v.practiceId,
    patientId: v.patientId,
    siteId: v.siteId,
    restorationId: v.restorationId,
    componentId: v.componentId,
    installedOn: v.changedOn,
    replacesId: inPlace.at(-1)?.id ?? null,
    recordedBy: v.recordedBy,
  });
  return true;
}
