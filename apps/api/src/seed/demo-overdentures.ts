// Demo overdentures (issue 16): invented patients and invented catalogue parts only.
// Beatrix Lindqvist wears a mandibular two-implant overdenture on stud attachments since 2016 (the
// first-choice treatment of the McGill and York consensus statements); Otto Ravensworth a maxillary
// bar overdenture on four implants; Agnes Thornbury has two implants healing at 33 and 43, to plan.
// Beatrix's inserts are changed about yearly (the last change five months ago, so her review is not
// due); Otto's clips were never changed since 2021, so his insert review is overdue on the desk.
import { addCalendarDays as addDays, addCalendarMonths } from '@torquetrail/domain';
import { at, addPatient, addSite, birthDate, type Ctx, install, place, restoration, seated } from './demo-builders.js';
import { insertChanges } from '../db/schema/index.js';
import { fitInsert } from '../db/insert-fitting.js';

const LOWER_ARCH = [31, 32, 33, 34, 35, 36, 37, 38, 41, 42, 43, 44, 45, 46, 47, 48];
const UPPER_ARCH = [11, 12, 13, 14, 15, 16, 17, 18, 21, 22, 23, 24, 25, 26, 27, 28];
const without = (arch: number[], implants: number[]) => arch.filter((t) => !implants.includes(t));

/** Seeds the three patients into the practice of `ctx`; returns how many patients and sites it added. */
export async function seedOverdenturePatients(ctx: Ctx, today: string): Promise<{ patients: number; sites: number }> {
  const { tx, practiceId } = ctx;

  // Beatrix Lindqvist: stud attachments at 33 and 43, the denture delivered in 2016.
  const beatrix = await addPatient(tx, practiceId, {
    chartNumber: 'LL-1006',
    givenName: 'Beatrix',
    familyName: 'Lindqvist',
    birthDate: birthDate(today, 78, '06-19'),
    email: 'beatrix.lindqvist@mail.example',
    missingTeeth: [...without(LOWER_ARCH, [33, 43]), ...UPPER_ARCH],
  });
  const beatrixSites: { fdi: number; axis: [number, number, number] }[] = [
    { fdi: 33, axis: [0.12, 0.05, 1] },
    { fdi: 43, axis: [-0.1, 0.04, 1] },
  ];
  const beatrixSiteIds: string[] = [];
  for (const s of beatrixSites) {
    const siteId = await addSite(ctx, beatrix, s.fdi, 'restored');
    beatrixSiteIds.push(siteId);
    await place(ctx, {
      patientId: beatrix,
      siteId,
      platform: 'MHX-4.1',
      placedOn: '2015-10-06',
      lengthMm: 10,
      lot: 'MHX41-1510',
      insertionTorqueNcm: 35,
      isq: 70,
      axis: s.axis,
    });
  }
  const studs = await restoration(ctx, {
    patientId: beatrix,
    kind: 'overdenture-studs',
    retention: 'screw-to-implant',
    material: 'other',
    shade: 'A3',
    impressionOn: '2016-02-15',
    deliveredOn: '2016-03-14',
    sites: beatrixSiteIds.map((siteId) => ({
      siteId,
      interface: 'non-engaging' as const,
      coping: 'non-engaging' as const,
    })),
  });
  for (const siteId of beatrixSiteIds) {
    await install(ctx, {
      patientId: beatrix,
      siteId,
      restorationId: studs,
      platform: 'MHX-4.1',
      part: 'stud-attachment',
      lot: 'ST3-1602-08',
      installedOn: '2016-03-14',
      torque: seated('2016-03-14', 30),
    });
    await install(ctx, {
      patientId: beatrix,
      siteId,
      restorationId: studs,
      platform: 'MHX-4.1',
      part: 'insert-medium',
      lot: 'RIM-1602-21',
      installedOn: '2016-03-14',
    });
  }

  await seedBeatrixInsertChanges(ctx, { patientId: beatrix, restorationId: studs, siteIds: beatrixSiteIds }, today);

  // Otto Ravensworth: a bar screwed to four maxillary implants, two clips in the denture.
  const otto = await addPatient(tx, practiceId, {
    chartNumber: 'LL-1007',
    givenName: 'Otto',
    familyName: 'Ravensworth',
    birthDate: birthDate(today, 74, '02-27'),
    email: 'otto.ravensworth@mail.example',
    missingTeeth: [...without(UPPER_ARCH, [14, 12, 22, 24]), 36, 46],
  });
  const ottoSites: { fdi: number; axis: [number, number, number] }[] = [
    { fdi: 14, axis: [0.08, 0, 1] },
    { fdi: 12, axis: [0.02, 0.06, 1] },
    { fdi: 22, axis: [-0.02, 0.06, 1] },
    { fdi: 24, axis: [-0.08, 0, 1] },
  ];
  const ottoSiteIds: string[] = [];
  for (const s of ottoSites) {
    const siteId = await addSite(ctx, otto, s.fdi, 'restored');
    ottoSiteIds.push(siteId);
    await place(ctx, {
      patientId: otto,
      siteId,
      platform: 'SCN-4.3',
      placedOn: '2020-09-15',
      lengthMm: 11.5,
      lot: 'SCN43-2009',
      insertionTorqueNcm: 40,
      isq: 67,
      axis: s.axis,
    });
  }
  const bar = await restoration(ctx, {
    patientId: otto,
    kind: 'overdenture-bar',
    retention: 'screw-to-implant',
    material: 'other',
    shade: 'A2',
    impressionOn: '2021-01-18',
    deliveredOn: '2021-03-01',
    copingsSplinted: true,
    sites: ottoSiteIds.map((siteId) => ({
      siteId,
      interface: 'non-engaging' as const,
      coping: 'non-engaging' as const,
      spaceMm: 13,
    })),
  });
  for (const [i, siteId] of ottoSiteIds.entries()) {
    await install(ctx, {
      patientId: otto,
      siteId,
      restorationId: bar,
      platform: 'SCN-4.3',
      part: 'bridge-screw',
      lot: 'PSI-2102-11',
      installedOn: '2021-03-01',
      torque: seated('2021-03-01', 25),
    });
    // The clips ride on the bar's anterior segment, over 12 and 22.
    if (ottoSites[i].fdi === 12 || ottoSites[i].fdi === 22)
      await install(ctx, {
        patientId: otto,
        siteId,
        restorationId: bar,
        platform: 'SCN-4.3',
        part: 'bar-clip',
        lot: 'BC-2102-03',
        installedOn: '2021-03-01',
      });
  }

  // Agnes Thornbury: two implants at 33 and 43, healing abutments on, the overdenture still to plan.
  const agnes = await addPatient(tx, practiceId, {
    chartNumber: 'LL-1008',
    givenName: 'Agnes',
    familyName: 'Thornbury',
    birthDate: birthDate(today, 81, '08-08'),
    missingTeeth: [...without(LOWER_ARCH, [33, 43]), ...UPPER_ARCH],
  });
  const agnesPlacedOn = addDays(today, -112);
  for (const [fdi, axis] of [
    [33, [0.1, 0.03, 1]],
    [43, [-0.1, 0.03, 1]],
  ] as const) {
    const siteId = await addSite(ctx, agnes, fdi, 'placed');
    await place(ctx, {
      patientId: agnes,
      siteId,
      platform: 'MHX-4.1',
      placedOn: agnesPlacedOn,
      lengthMm: 8.5,
      lot: 'MHX41-2608',
      insertionTorqueNcm: 30,
      isq: 66,
      axis: [...axis],
    });
    await install(ctx, {
      patientId: agnes,
      siteId,
      platform: 'MHX-4.1',
      part: 'healing',
      lot: 'HA4-2608-02',
      installedOn: agnesPlacedOn,
    });
  }
  return { patients: 3, sites: 8 };
}

/**
 * Beatrix's yearly insert changes since the 2016 delivery (invented): worn medium inserts replaced
 * by medium ones, a retention loss answered with strong inserts, one fractured insert at 43 alone.
 */
async function seedBeatrixInsertChanges(
  ctx: Ctx,
  b: { patientId: string; restorationId: string; siteIds: string[] },
  today: string,
) {
  const parts = ctx.catalogue.get('MHX-4.1')!.parts;
  const dates: string[] = [];
  for (let d = addCalendarMonths(today, -5); d > '2016-09-14'; d = addCalendarMonths(d, -12)) dates.unshift(d);
  const hygienist = ctx.userIds.get('maren.holt@larkspur.example')!;
  let strength = 'insert-medium';
  for (const [i, changedOn] of dates.entries()) {
    const reason = i === 4 ? 'retention-loss' : i === 6 ? 'fracture' : 'wear';
    const next = i >= 4 ? 'insert-strong' : 'insert-medium';
    const notes =
      reason === 'retention-loss'
        ? 'The denture lifts when eating; stronger inserts fitted'
        : reason === 'fracture'
          ? 'Insert split at 43; 33 still holding'
          : null;
    // A fractured insert is changed at its own site only.
    const sites = reason === 'fracture' ? b.siteIds.slice(1) : b.siteIds;
    for (const siteId of sites) {
      const [change] = await ctx.tx
        .insert(insertChanges)
        .values({
          practiceId: ctx.practiceId,
          patientId: b.patientId,
          siteId,
          restorationId: b.restorationId,
          changedOn,
          oldComponentId: parts.get(strength)!,
          newComponentId: parts.get(next)!,
          reason,
          notes,
          recordedBy: hygienist,
          recordedAt: at(changedOn, '11:00'),
        })
        .returning({ id: insertChanges.id });
      // As logging one in the app does, the new insert replaces the one in the Stack.
      await fitInsert(ctx.tx, {
        insertChangeId: change.id,
        practiceId: ctx.practiceId,
        patientId: b.patientId,
        siteId,
        restorationId: b.restorationId,
        componentId: parts.get(next)!,
        changedOn,
        recordedBy: hygienist,
      });
    }
    strength = next;
  }
}
