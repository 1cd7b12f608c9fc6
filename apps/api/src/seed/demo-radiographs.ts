// Radiographs of the demo patients over the years (issue 10), stored as an upload stores them:
// the file drawn here (DICOM or PNG), typed by its bytes, DICOM attributes read by the API's own
// parser, previews made by the API's preview code, every object put to S3 through the SDK, then
// the rows. One radiograph per recall visit whose exam recorded a bone level, with that visit's
// sites measured so that the worse of mesial and distal is the exam's bone level (Desmond's loss
// shows, Harold's stays flat: both come from demo-recall-history.ts). Also Lucía's crown on the
// day it was delivered, with its seating confirmed, Wendell's post-operative film and one image
// per Quarry Hill patient.
import { createHash, randomUUID } from 'node:crypto';
import { Readable } from 'node:stream';
import { and, asc, eq, isNotNull, like } from 'drizzle-orm';
import type { RadiographKind } from '@torquetrail/contracts';
import { measureBoneLevels, RULES_VERSION } from '@torquetrail/domain';
import type { Tx } from '../db/database.js';
import {
  implantSites,
  patients,
  placements,
  radiographMeasurements,
  radiographs,
  radiographSites,
  recallExams,
  restorations,
  seatingChecks,
} from '../db/schema/index.js';
import { dicomAttributes, parseDicom } from '../radiographs/dicom.js';
import { CONTENT_TYPES, detectFileType } from '../radiographs/file-type.js';
import { makePreviews } from '../radiographs/preview.js';
import type { DemoRefs } from './demo-scenario.js';
import {
  DEMO_MM_PER_PX,
  dicomOf,
  type DrawnImplant,
  drawRadiograph,
  implantGeometry,
  pngOf,
} from './demo-radiograph-files.js';

/** What the seed needs of object storage (StorageService has it). */
export interface SeedStorage {
  put(key: string, body: Buffer, contentType: string): Promise<void>;
}

const DENTIST = 'ines.calloway@larkspur.example';
const SURGEON = 'rafael.imbert@northgate.example';
const QUARRY_DENTIST = 'nell.ashdown@quarryhill.example';

interface ShotSite {
  siteId: string;
  lengthMm: number;
  /** The exam's bone level that day, when one was recorded: then the site is measured. */
  boneMm: number | null;
}
interface Shot {
  practiceId: string;
  patientId: string;
  takenOn: string;
  uploadedBy: string;
  sites: ShotSite[];
  note: string | null;
}

const round1 = (v: number) => Math.round(v * 10) / 10;

/** Mesial and distal of one measured site: the worse side is the exam's value, the other a little better. */
function sides(boneMm: number, turn: number): { mesialMm: number; distalMm: number } {
  const other = Math.max(0, round1(boneMm - 0.2 - 0.1 * (turn % 3)));
  return turn % 2 === 0 ? { mesialMm: boneMm, distalMm: other } : { mesialMm: other, distalMm: boneMm };
}

export async function seedDemoRadiographs(
  tx: Tx,
  refs: DemoRefs,
  storage: SeedStorage,
): Promise<{ radiographs: number; measurements: number }> {
  const lengthBySite = new Map(
    (await tx.select({ siteId: placements.siteId, lengthMm: placements.lengthMm }).from(placements)).map((p) => [
      p.siteId,
      p.lengthMm,
    ]),
  );
  const placedOn = new Map(
    (await tx.select({ siteId: placements.siteId, on: placements.placedOn }).from(placements)).map((p) => [
      p.siteId,
      p.on,
    ]),
  );
  const exams = await tx
    .select({
      practiceId: recallExams.practiceId,
      patientId: recallExams.patientId,
      siteId: recallExams.siteId,
      on: recallExams.examinedOn,
      examinerId: recallExams.examinerId,
      boneMm: recallExams.boneLevelMm,
    })
    .from(recallExams)
    .innerJoin(implantSites, eq(implantSites.id, recallExams.siteId))
    .where(isNotNull(recallExams.boneLevelMm))
    .orderBy(asc(recallExams.patientId), asc(recallExams.examinedOn), asc(implantSites.fdi));

  // One radiograph per patient and visit day, showing every site measured that day.
  const shots: Shot[] = [];
  for (const e of exams) {
    const last = shots[shots.length - 1];
    const site = { siteId: e.siteId, lengthMm: lengthBySite.get(e.siteId)!, boneMm: e.boneMm };
    if (last && last.patientId === e.patientId && last.takenOn === e.on) last.sites.push(site);
    else
      shots.push({
        practiceId: e.practiceId,
        patientId: e.patientId,
        takenOn: e.on,
        uploadedBy: e.examinerId,
        sites: [site],
        note: null,
      });
  }
  const larkspur = refs.practiceIds.larkspur;
  const site = (key: string): ShotSite => {
    const siteId = refs.siteIds.get(key)!;
    return { siteId, lengthMm: lengthBySite.get(siteId)!, boneMm: null };
  };
  const lucia14 = site('LL-1004:14');
  const seatingShot: Shot = {
    practiceId: larkspur,
    patientId: refs.patientIds.get('LL-1004')!,
    takenOn: '2020-03-09',
    uploadedBy: refs.userIds.get(DENTIST)!,
    sites: [lucia14],
    note: 'Taken after seating the crown',
  };
  shots.push(seatingShot);
  const wendell = [site('LL-1005:15'), site('LL-1005:16')];
  shots.push({
    practiceId: larkspur,
    patientId: refs.patientIds.get('LL-1005')!,
    takenOn: placedOn.get(wendell[0].siteId)!,
    uploadedBy: refs.userIds.get(SURGEON)!,
    sites: wendell,
    note: 'Post-operative, healing abutments on',
  });
  const quarrySites = await tx
    .select({ siteId: implantSites.id, patientId: implantSites.patientId })
    .from(implantSites)
    .innerJoin(patients, eq(patients.id, implantSites.patientId))
    .where(and(eq(patients.practiceId, refs.practiceIds.quarry), like(patients.chartNumber, 'QH-%')));
  for (const q of quarrySites) {
    shots.push({
      practiceId: refs.practiceIds.quarry,
      patientId: q.patientId,
      takenOn: placedOn.get(q.siteId) ?? '2024-06-12',
      uploadedBy: refs.userIds.get(QUARRY_DENTIST)!,
      sites: [{ siteId: q.siteId, lengthMm: lengthBySite.get(q.siteId) ?? 10, boneMm: null }],
      note: null,
    });
  }
  // Every other Larkspur patient (the overdentures, the provisional) has at least the radiograph
  // taken at placement, showing all their implants; appended so the shots above keep their files.
  const pictured = new Set(shots.map((s) => s.patientId));
  const larkspurSites = await tx
    .select({ siteId: implantSites.id, patientId: implantSites.patientId })
    .from(implantSites)
    .where(eq(implantSites.practiceId, larkspur))
    .orderBy(asc(implantSites.patientId), asc(implantSites.fdi));
  for (const [chart, patientId] of [...refs.patientIds].sort(([a], [b]) => a.localeCompare(b))) {
    const own = larkspurSites.filter((s) => s.patientId === patientId && placedOn.has(s.siteId));
    if (pictured.has(patientId) || own.length === 0 || !chart.startsWith('LL-')) continue;
    shots.push({
      practiceId: larkspur,
      patientId,
      takenOn: own.map((s) => placedOn.get(s.siteId)!).sort()[0],
      uploadedBy: refs.userIds.get(DENTIST)!,
      sites: own.map((s) => ({ siteId: s.siteId, lengthMm: lengthBySite.get(s.siteId) ?? 10, boneMm: null })),
      note: 'Post-operative',
    });
  }

  const stored = await Promise.all(shots.map((shot, i) => storeShot(shot, i, storage)));
  await tx.insert(radiographs).values(stored.map((s) => s.row));
  await tx
    .insert(radiographSites)
    .values(stored.flatMap((s, i) => shots[i].sites.map((x) => ({ radiographId: s.row.id, siteId: x.siteId }))));
  const measurements = stored.flatMap((s) => s.measurements);
  if (measurements.length > 0) await tx.insert(radiographMeasurements).values(measurements);

  // Lucía's crown: its seating was confirmed on the radiograph taken the day it was delivered.
  const [crown] = await tx
    .select({ id: restorations.id })
    .from(restorations)
    .where(eq(restorations.patientId, seatingShot.patientId));
  const seatingRow = stored[shots.indexOf(seatingShot)].row;
  await tx.insert(seatingChecks).values({
    practiceId: larkspur,
    patientId: seatingShot.patientId,
    restorationId: crown.id,
    event: 'delivery',
    radiographId: seatingRow.id,
    seated: 'yes',
    note: 'Abutment and crown fully seated; no gap at the platform',
    recordedBy: seatingShot.uploadedBy,
    recordedAt: new Date('2020-03-09T12:00:00Z'),
  });
  return { radiographs: stored.length, measurements: measurements.length };
}

/**
 * The files of one demo radiograph, drawn and run through the upload's type detection, DICOM
 * parser and preview code. The same shot gives the same files, so they are made once per process:
 * the API tests reseed before every file, and drawing and previews are most of a seed's work.
 */
const rendered = new Map<string, Promise<Rendered>>();
type Rendered = Awaited<ReturnType<typeof render>>;

async function render(shot: Shot, index: number, implants: readonly DrawnImplant[]) {
  const image = drawRadiograph(implants, 1000 + index);
  // Every other one arrives as DICOM from the sensor; the rest as PNG exports.
  const bytes =
    index % 2 === 0
      ? dicomOf(image, { studyDate: shot.takenOn, seriesNumber: index + 1, name: `torquetrail-demo-${index}` })
      : await pngOf(image);
  const detected = detectFileType(bytes);
  if (detected.type === null) throw new Error(`seed radiograph ${index} is ${detected.described}`);
  const type = detected.type;
  const dicom = type === 'dicom' ? dicomAttributes(parseDicom(bytes, true)) : null;
  // The seed's images are small; the cap only guards the decoder as it does for uploads.
  const previews = await makePreviews(type, Readable.from([bytes]), { maxPixels: 100_000_000 });
  if (!previews.ok) throw new Error(`seed radiograph ${index}: ${previews.problem}`);
  return { bytes, type, dicom, previews, sha256: createHash('sha256').update(bytes).digest('hex') };
}

/** Draws (or reuses), stores (original, preview, thumbnail) and describes one radiograph with its measurements. */
async function storeShot(shot: Shot, index: number, storage: SeedStorage) {
  const turn = (k: number) => index + k;
  const implants = shot.sites.map((s, k) => ({
    lengthMm: s.lengthMm,
    ...(s.boneMm === null ? { mesialMm: null, distalMm: null } : sides(s.boneMm, turn(k))),
  }));
  const cacheKey = JSON.stringify([index, shot.takenOn, implants]);
  let files = rendered.get(cacheKey);
  if (!files) {
    files = render(shot, index, implants);
    rendered.set(cacheKey, files);
  }
  const { bytes, type, dicom, previews, sha256 } = await files;

  const id = randomUUID();
  const objectKey = `radiographs/${shot.practiceId}/${shot.patientId}/${id}`;
  await Promise.all([
    storage.put(objectKey, bytes, CONTENT_TYPES[type]),
    storage.put(`${objectKey}.preview.png`, previews.preview, 'image/png'),
    storage.put(`${objectKey}.thumbnail.png`, previews.thumbnail, 'image/png'),
  ]);
  const kind: RadiographKind = shot.sites.length > 2 ? 'panoramic' : 'periapical';
  const uploadedAt = new Date(`${shot.takenOn}T11:15:00Z`);
  const row: typeof radiographs.$inferInsert & { id: string } = {
    id,
    practiceId: shot.practiceId,
    patientId: shot.patientId,
    objectKey,
    sizeBytes: bytes.length,
    sha256,
    fileType: type,
    originalName: `${kind}-${shot.takenOn}.${type === 'dicom' ? 'dcm' : 'png'}`,
    kind,
    takenOn: shot.takenOn,
    note: shot.note,
    rows: dicom?.rows ?? previews.height,
    columns: dicom?.columns ?? previews.width,
    pixelSpacing: dicom?.pixelSpacing ?? null,
    imagerPixelSpacing: dicom?.imagerPixelSpacing ?? null,
    magnificationFactor: dicom?.magnificationFactor ?? null,
    studyDate: dicom?.studyDate ?? null,
    modality: dicom?.modality ?? null,
    bitsStored: dicom?.bitsStored ?? null,
    photometricInterpretation: dicom?.photometricInterpretation ?? null,
    transferSyntaxUid: dicom?.transferSyntaxUid ?? null,
    // Made above and stored with the original: nothing is left for the preview job.
    previewStatus: 'ready',
    previewProblem: null,
    uploadedBy: shot.uploadedBy,
    uploadedAt,
  };

  // The marks a person would place on this picture: shoulder, apex, first bone contact each side.
  const measurements = shot.sites.flatMap((s, k) => {
    if (s.boneMm === null) return [];
    const g = implantGeometry(k, s.lengthMm);
    const { mesialMm, distalMm } = sides(s.boneMm, turn(k));
    const points = {
      platform: [
        { row: g.platformRow, col: g.left },
        { row: g.platformRow, col: g.right },
      ] as [{ row: number; col: number }, { row: number; col: number }],
      apex: { row: g.apexRow, col: g.centre },
      mesial: { row: g.platformRow + mesialMm / DEMO_MM_PER_PX, col: g.left - 1 },
      distal: { row: g.platformRow + distalMm / DEMO_MM_PER_PX, col: g.right + 1 },
    };
    const result = measureBoneLevels({ marks: points, implantTrueMm: s.lengthMm, pixelSpacing: row.pixelSpacing });
    return [
      {
        practiceId: shot.practiceId,
        patientId: shot.patientId,
        radiographId: id,
        siteId: s.siteId,
        points,
        implantTrueMm: s.lengthMm,
        mmPerUnit: result.mmPerUnit,
        mesialMm: result.mesialMm,
        distalMm: result.distalMm,
        spacingEstimate: result.spacing ? { ...result.spacing } : null,
        rulesVersion: RULES_VERSION,
        measuredBy: shot.uploadedBy,
        measuredAt: new Date(`${shot.takenOn}T11:30:00Z`),
      },
    ];
  });
  return { row, measurements };
}
