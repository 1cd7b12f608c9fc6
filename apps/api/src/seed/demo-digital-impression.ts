// Wendell's new plan (LL-1005, 15 and 16 on Tessely EX 4.1): a splinted screw-retained bridge,
// taken as a digital impression with a scan body at each site (lots recorded) and one small scan
// file drawn by code (demo-scan-file.ts), stored in the object store like an upload.
import { createHash, randomUUID } from 'node:crypto';
import { and, eq, like } from 'drizzle-orm';
import type { Tx } from '../db/database.js';
import {
  components,
  impressionScanBodies,
  impressions,
  platforms,
  restorationSiteComponents,
  restorationSites,
  restorations,
  scanBodyMarkers,
  scanFiles,
} from '../db/schema/index.js';
import { binaryStl, DEMO_SCAN_BODY_TOPS, demoScanTriangles } from './demo-scan-file.js';
import type { DemoRefs } from './demo-scenario.js';
import type { SeedStorage } from './demo-radiographs.js';

const DENTIST = 'ines.calloway@larkspur.example';
const addDays = (iso: string, days: number) =>
  new Date(Date.parse(`${iso}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);

export async function seedDigitalImpression(tx: Tx, refs: DemoRefs, storage: SeedStorage): Promise<void> {
  const practiceId = refs.practiceIds.larkspur;
  const patientId = refs.patientIds.get('LL-1005')!;
  const dentist = refs.userIds.get(DENTIST)!;
  const sites = [15, 16].map((fdi) => ({ fdi, siteId: refs.siteIds.get(`LL-1005:${fdi}`)! }));
  const [platform] = await tx
    .select({ id: platforms.id })
    .from(platforms)
    .where(and(eq(platforms.practiceId, practiceId), eq(platforms.name, 'Tessely EX 4.1')));
  const part = async (suffix: string) => {
    const [row] = await tx
      .select({ id: components.id })
      .from(components)
      .where(and(eq(components.platformId, platform.id), like(components.referenceCode, `%-${suffix}`)));
    return row.id;
  };
  const scanBody = await part('SB');
  const screw = await part('PSI');
  const takenOn = addDays(refs.today, -2);

  const [plan] = await tx
    .insert(restorations)
    .values({
      practiceId,
      patientId,
      kind: 'splinted-bridge',
      retention: 'screw-to-implant',
      material: 'zirconia',
      status: 'planned',
      copingsSplinted: false,
      plannedBy: dentist,
      notes: 'Digital impression after tissue conditioning',
    })
    .returning({ id: restorations.id });
  for (const s of sites) {
    const [rs] = await tx
      .insert(restorationSites)
      .values({
        practiceId,
        restorationId: plan.id,
        siteId: s.siteId,
        interface: 'non-engaging',
        impressionCoping: 'non-engaging',
      })
      .returning({ id: restorationSites.id });
    await tx.insert(restorationSiteComponents).values({ practiceId, restorationSiteId: rs.id, componentId: screw });
  }
  const [impression] = await tx
    .insert(impressions)
    .values({
      practiceId,
      patientId,
      restorationId: plan.id,
      method: 'digital',
      takenOn,
      note: 'Upper right quadrant scanned with both scan bodies seated',
      recordedBy: dentist,
    })
    .returning({ id: impressions.id });
  await tx.insert(impressionScanBodies).values(
    sites.map((s) => ({
      practiceId,
      impressionId: impression.id,
      siteId: s.siteId,
      componentId: scanBody,
      lot: `SBX41-26${s.fdi}`,
    })),
  );
  const bytes = binaryStl(demoScanTriangles(), 'Torquetrail demo scan: invented ridge with two scan bodies');
  const id = randomUUID();
  const objectKey = `scan-files/${practiceId}/${patientId}/${id}`;
  // The object first, as an upload does: the row never points at a missing file.
  await storage.put(objectKey, bytes, 'model/stl');
  await tx.insert(scanFiles).values({
    id,
    practiceId,
    patientId,
    restorationId: plan.id,
    impressionId: impression.id,
    objectKey,
    sizeBytes: bytes.length,
    sha256: createHash('sha256').update(bytes).digest('hex'),
    fileType: 'stl',
    originalName: 'upper-right-15-16.stl',
    uploadedBy: dentist,
  });
  // The dentist marked each scan body on the file: the top of the shape drawn for it.
  await tx.insert(scanBodyMarkers).values(
    sites.map((s) => {
      const [x, y, z] = DEMO_SCAN_BODY_TOPS[s.fdi as keyof typeof DEMO_SCAN_BODY_TOPS];
      return { practiceId, patientId, scanFileId: id, siteId: s.siteId, x, y, z, placedBy: dentist };
    }),
  );
}
