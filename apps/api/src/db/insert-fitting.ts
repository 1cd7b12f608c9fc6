// The Stack's retentive inserts and bar clips: a logged insert change (the app's or the demo's)
// takes the insert in place out and installs the new one, as any replaced part is recorded; an
// amendment of the change moves the Stack with it (issue 16 item 2).
import { and, eq, inArray, isNull } from 'drizzle-orm';
import { DENTURE_RETAINER_KINDS } from '@torquetrail/contracts';
import type { Tx } from './database.js';
import { partInPlace } from './parts-in-place.js';
import { componentInstances, components } from './schema/index.js';

interface Fitting {
  practiceId: string;
  patientId: string;
  siteId: string;
  restorationId: string;
  /** The insert change (the version) that fits the part. */
  insertChangeId: string;
  componentId: string;
  changedOn: string;
  recordedBy: string | null;
}

/**
 * Puts a logged insert change into the Stack: the insert in place at the site comes out on the day
 * of the change (its row and history stay) and the new one is installed, replacing it, linked to
 * the change. A change dated before the insert now in place (history typed in later) leaves the
 * Stack as it is. Answers whether the Stack changed.
 */
export async function fitInsert(tx: Tx, v: Fitting): Promise<boolean> {
  const inPlace = await tx
    .select({ id: componentInstances.id, installedOn: componentInstances.installedOn })
    .from(componentInstances)
    .innerJoin(components, eq(components.id, componentInstances.componentId))
    .where(
      and(
        eq(componentInstances.siteId, v.siteId),
        partInPlace(),
        inArray(components.kind, [...DENTURE_RETAINER_KINDS]),
      ),
    )
    .orderBy(componentInstances.installedOn)
    .for('update', { of: componentInstances });
  if (inPlace.some((p) => p.installedOn > v.changedOn)) return false;
  for (const p of inPlace)
    await tx.update(componentInstances).set({ removedOn: v.changedOn }).where(eq(componentInstances.id, p.id));
  await install(tx, v, inPlace.at(-1)?.id ?? null, null);
  return true;
}

function install(tx: Tx, v: Fitting, replacesId: string | null, removedOn: string | null) {
  return tx.insert(componentInstances).values({
    practiceId: v.practiceId,
    patientId: v.patientId,
    siteId: v.siteId,
    restorationId: v.restorationId,
    componentId: v.componentId,
    installedOn: v.changedOn,
    removedOn,
    replacesId,
    insertChangeId: v.insertChangeId,
    recordedBy: v.recordedBy,
  });
}

/** Why an amendment cannot move the Stack, said beside the date. */
export type RefitProblem = { changedOn: string };

/**
 * Moves the Stack with an amendment of an insert change (`supersededId` → the new version `v`).
 * When the amendment keeps the part and the day, the fitted insert simply follows the new version.
 * Otherwise the insert the old version fitted is marked entered in error (it stays, for the
 * record) and the right one is installed on the amended day in its place: the insert it replaced
 * comes out on that day instead, and a later change that took it out takes the new one out.
 * A change that never reached the Stack (history typed in later) is fitted as a new change would be.
 */
export async function refitInsert(
  tx: Tx,
  supersededId: string,
  v: Fitting,
  reason: string,
): Promise<RefitProblem | null> {
  const [fitted] = await tx
    .select({
      id: componentInstances.id,
      componentId: componentInstances.componentId,
      installedOn: componentInstances.installedOn,
      removedOn: componentInstances.removedOn,
      replacesId: componentInstances.replacesId,
    })
    .from(componentInstances)
    .where(and(eq(componentInstances.insertChangeId, supersededId), isNull(componentInstances.enteredInErrorAt)))
    .for('update');
  if (!fitted) {
    await fitInsert(tx, v);
    return null;
  }
  if (fitted.componentId === v.componentId && fitted.installedOn === v.changedOn) {
    await tx
      .update(componentInstances)
      .set({ insertChangeId: v.insertChangeId })
      .where(eq(componentInstances.id, fitted.id));
    return null;
  }
  const [replaced] = fitted.replacesId
    ? await tx
        .select({ id: componentInstances.id, installedOn: componentInstances.installedOn })
        .from(componentInstances)
        .where(eq(componentInstances.id, fitted.replacesId))
        .for('update')
    : [];
  if (replaced && v.changedOn < replaced.installedOn)
    return { changedOn: 'Cannot be before the insert it replaced was fitted' };
  if (fitted.removedOn !== null && v.changedOn > fitted.removedOn)
    return { changedOn: 'Cannot be after the next change took this insert out' };
  await tx
    .update(componentInstances)
    .set({ enteredInErrorAt: new Date(), enteredInErrorReason: reason })
    .where(eq(componentInstances.id, fitted.id));
  if (replaced)
    await tx.update(componentInstances).set({ removedOn: v.changedOn }).where(eq(componentInstances.id, replaced.id));
  const [right] = await install(tx, v, replaced?.id ?? null, fitted.removedOn).returning({
    id: componentInstances.id,
  });
  // The part that later replaced the wrong one now replaces the right one.
  await tx
    .update(componentInstances)
    .set({ replacesId: right.id })
    .where(and(eq(componentInstances.replacesId, fitted.id), isNull(componentInstances.enteredInErrorAt)));
  return null;
}
