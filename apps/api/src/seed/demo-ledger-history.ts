// Ledger history on top of the demo scenario: the complications behind the torque entries the
// scenario already holds, and a recent calibration of the friction wrench.
import { and, eq } from 'drizzle-orm';
import type { Tx } from '../db/database.js';
import { complications, componentInstances, torqueWrenches, wrenchCalibrations } from '../db/schema/index.js';
import type { DemoRefs } from './demo-scenario.js';

export async function seedLedgerHistory(tx: Tx, refs: DemoRefs): Promise<void> {
  const practiceId = refs.practiceIds.larkspur;
  const dentist = refs.userIds.get('ines.calloway@larkspur.example')!;
  const harold = refs.patientIds.get('LL-1001')!;

  // Harold Whitcombe, 2016: the prosthetic screws of the 35–37 bridge were found loose and
  // re-torqued (the torque entries are in the scenario); the complication is recorded here.
  for (const fdi of [35, 37]) {
    const siteId = refs.siteIds.get(`LL-1001:${fdi}`)!;
    const [screw] = await tx
      .select({ id: componentInstances.id })
      .from(componentInstances)
      .where(and(eq(componentInstances.siteId, siteId), eq(componentInstances.installedOn, '2012-09-20')));
    await tx.insert(complications).values({
      practiceId,
      patientId: harold,
      siteId,
      componentInstanceId: screw?.id ?? null,
      kind: 'screw-loosening',
      occurredOn: '2016-05-10',
      notes:
        'Bridge slightly mobile at recall; prosthetic screws found loose, occlusion adjusted, screws re-torqued to 25 N·cm.',
      recordedBy: dentist,
      recordedAt: new Date('2016-05-10T10:00:00Z'),
    });
  }

  // Desmond Okafor, 2019: a small veneer chip on the cement-retained crown at 46, polished.
  await tx.insert(complications).values({
    practiceId,
    patientId: refs.patientIds.get('LL-1003')!,
    siteId: refs.siteIds.get('LL-1003:46')!,
    kind: 'veneer-chipping',
    occurredOn: '2019-08-14',
    notes: 'Small mesio-buccal porcelain chip, polished; crown kept.',
    recordedBy: dentist,
    recordedAt: new Date('2019-08-14T11:00:00Z'),
  });

  // The friction wrench was recalibrated last month (friction devices drift with age: Vallee et al. 2008).
  const lastMonth = new Date(`${refs.today}T00:00:00Z`);
  lastMonth.setUTCDate(lastMonth.getUTCDate() - 30);
  const friction = await tx
    .select({ id: torqueWrenches.id })
    .from(torqueWrenches)
    .where(and(eq(torqueWrenches.practiceId, practiceId), eq(torqueWrenches.type, 'friction')));
  if (friction.length > 0)
    await tx.insert(wrenchCalibrations).values(
      friction.map((w) => ({
        practiceId,
        wrenchLineageId: w.id,
        calibratedOn: lastMonth.toISOString().slice(0, 10),
        note: 'Recalibrated after a reading drifted',
      })),
    );
}
