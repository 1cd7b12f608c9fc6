// One patient's implant record as the records that leave the practice read it (the FHIR export,
// the implant passport, the retrieval card): loaded once by records-out.repository.ts, then
// mapped by pure functions that do no I/O, so each output is a function of this snapshot alone.
import {
  type ComponentKind,
  type Connection,
  type CopingLevel,
  type ImpressionMethod,
  type ScanFileType,
  type DateFormat,
  type Material,
  type PatientSex,
  type RestorationKind,
  type Retention,
  STACK_ORDER,
} from '@torquetrail/contracts';
import {
  inChartOrder,
  type PeriImplantStatus,
  type ProbingPosition,
  SEATING_REASONS,
  type TorqueReason,
} from '@torquetrail/domain';
import type * as repo from './records-out.repository.js';

export interface SnapshotPatient {
  id: string;
  chartNumber: string;
  givenName: string;
  familyName: string;
  birthDate: string;
  sex: PatientSex;
  email: string | null;
  phone: string | null;
  emailConsent: boolean;
}

interface SnapshotPractice {
  id: string;
  name: string;
  dateFormat: DateFormat;
  phone: string | null;
  email: string | null;
  address: string | null;
}

interface SnapshotPlacement {
  id: string;
  placedOn: string;
  surgeonName: string;
  systemName: string;
  manufacturer: string;
  platformName: string;
  diameterMm: number;
  connection: Connection;
  lengthMm: number;
  lot: string | null;
  udi: string | null;
}

interface SnapshotTorque {
  appliedNcm: number;
  performedAt: string;
  reason: TorqueReason;
}

/** A part in the mouth now (not removed), with its catalogue data as recorded. */
export interface SnapshotPart {
  id: string;
  kind: ComponentKind;
  name: string;
  referenceCode: string;
  manufacturer: string;
  lot: string | null;
  installedOn: string;
  torqueSpecNcm: number | null;
  tolerancePct: number;
  /** The torque of the seating at delivery (the first seating), when logged. */
  seatingTorque: SnapshotTorque | null;
  /** The latest torque of any reason, when logged. */
  lastTorque: SnapshotTorque | null;
}

export interface SnapshotRestoration {
  id: string;
  kind: RestorationKind;
  retention: Retention;
  material: Material;
  deliveredOn: string;
  /** FDI positions of every site the restoration rests on (a bridge spans several). */
  fdis: number[];
  dentistName: string | null;
}

export interface SnapshotExam {
  id: string;
  examinedOn: string;
  examinerName: string;
  probing: { position: ProbingPosition; depthMm: number; bleeding: boolean; suppuration: boolean }[];
  boneLevelMm: number | null;
  status: PeriImplantStatus;
  rulesVersion: string;
}

export interface SnapshotImplant {
  siteId: string;
  fdi: number;
  placement: SnapshotPlacement;
  /** The delivered restoration on this site, if any. */
  restoration: SnapshotRestoration | null;
  parts: SnapshotPart[];
  /** Current (not superseded) exams, oldest first. */
  exams: SnapshotExam[];
}

/** A coping or scan body an impression was taken with (in the mouth for the impression only). */
interface SnapshotImpressionPart {
  id: string;
  fdi: number;
  kind: ComponentKind;
  name: string;
  referenceCode: string;
  manufacturer: string;
  copingLevel: CopingLevel | null;
  lot: string | null;
}

/** A scanner's file of a digital impression. */
interface SnapshotScanFile {
  id: string;
  fileType: ScanFileType;
  originalName: string | null;
  sizeBytes: number;
  sha256: string;
  uploadedAt: string;
}

/** The current version of one restoration's impression: analog (copings) or digital (scan bodies, files). */
export interface SnapshotImpression {
  id: string;
  restorationId: string;
  method: ImpressionMethod;
  takenOn: string;
  recordedByName: string;
  /** FDI positions of the restoration's sites, in chart order. */
  fdis: number[];
  /** Analog: the copings planned per site; digital: the scan bodies recorded per site. */
  parts: SnapshotImpressionPart[];
  /** Digital: every scan file uploaded to the restoration's impression. */
  files: SnapshotScanFile[];
}

export interface RecordSnapshot {
  patient: SnapshotPatient;
  practice: SnapshotPractice;
  nextRecallOn: string | null;
  /** Implants with a current placement, in chart order. */
  implants: SnapshotImplant[];
  /** Impressions (current versions), oldest first. */
  impressions: SnapshotImpression[];
}

type Rows<K extends keyof typeof repo> = Awaited<ReturnType<(typeof repo)[K]>>;

export interface SnapshotRows {
  patient: NonNullable<Rows<'findVisiblePatient'>>;
  placements: Rows<'placementsOfPatient'>;
  restorations: Rows<'deliveredRestorationsOfPatient'>;
  parts: Rows<'partsOfPatient'>;
  torque: Rows<'torqueOfParts'>;
  exams: Rows<'examsOfPatient'>;
  probing: Rows<'probingOfExams'>;
  nextRecallOn: string | null;
  impressions: ImpressionRows;
}

/** What the repository loads for the impressions of the record. */
export interface ImpressionRows {
  impressions: Rows<'impressionsOfPatient'>;
  sites: Rows<'sitesOfRestorations'>;
  scanBodies: Rows<'scanBodiesOfImpressions'>;
  copings: Rows<'copingsOfRestorations'>;
  lots: Rows<'partLotsOfRestorations'>;
  files: Rows<'scanFilesOfRestorations'>;
}

/** Each impression with its sites, parts (copings or scan bodies, by method) and scan files. */
function buildImpressions(rows: ImpressionRows): SnapshotImpression[] {
  return rows.impressions.map((i): SnapshotImpression => {
    const digital = i.method === 'digital';
    const parts = digital
      ? rows.scanBodies.filter((b) => b.impressionId === i.id).map(({ impressionId: _i, ...b }) => b)
      : rows.copings
          .filter((c) => c.restorationId === i.restorationId)
          .map(({ restorationId, siteId, componentId, ...c }) => ({
            ...c,
            lot:
              rows.lots.find(
                (l) => l.restorationId === restorationId && l.siteId === siteId && l.componentId === componentId,
              )?.lot ?? null,
          }));
    return {
      id: i.id,
      restorationId: i.restorationId,
      method: i.method,
      takenOn: i.takenOn,
      recordedByName: i.recordedByName,
      fdis: rows.sites.filter((s) => s.restorationId === i.restorationId).map((s) => s.fdi),
      parts,
      files: digital
        ? rows.files
            .filter((f) => f.restorationId === i.restorationId)
            .map(({ restorationId: _r, uploadedAt, ...f }) => ({ ...f, uploadedAt: uploadedAt.toISOString() }))
        : [],
    };
  });
}

const torqueOf = (t: Rows<'torqueOfParts'>[number]): SnapshotTorque => ({
  appliedNcm: t.appliedNcm,
  performedAt: t.performedAt.toISOString(),
  reason: t.reason,
});

/** The snapshot from the rows the repository loaded (one current placement per site, chart order). */
export function buildSnapshot(rows: SnapshotRows): RecordSnapshot {
  const { practice, ...patient } = rows.patient;
  const fdisOf = new Map<string, number[]>();
  for (const r of rows.restorations) fdisOf.set(r.id, [...(fdisOf.get(r.id) ?? []), r.fdi]);
  const implants: SnapshotImplant[] = [];
  const seen = new Set<string>();
  for (const p of rows.placements) {
    if (seen.has(p.siteId)) continue;
    seen.add(p.siteId);
    const { siteId, fdi, ...placement } = p;
    // The latest delivery on the site is what is in the mouth now.
    const r = [...rows.restorations].reverse().find((x) => x.siteId === siteId);
    const parts = rows.parts
      .filter((x) => x.siteId === siteId)
      .map(({ siteId: _s, ...part }): SnapshotPart => {
        const log = rows.torque.filter((t) => t.instanceId === part.id);
        const seating = [...log].reverse().find((t) => SEATING_REASONS.includes(t.reason));
        const last = log.at(-1);
        return { ...part, seatingTorque: seating ? torqueOf(seating) : null, lastTorque: last ? torqueOf(last) : null };
      })
      .sort((a, b) => STACK_ORDER.indexOf(a.kind) - STACK_ORDER.indexOf(b.kind));
    const exams = rows.exams
      .filter((e) => e.siteId === siteId)
      .map(({ siteId: _s, ...exam }): SnapshotExam => ({
        ...exam,
        probing: inChartOrder(rows.probing.filter((x) => x.examId === exam.id)).map(({ examId: _e, ...site }) => site),
      }));
    implants.push({
      siteId,
      fdi,
      placement,
      restoration:
        r && r.deliveredOn
          ? {
              id: r.id,
              kind: r.kind,
              retention: r.retention,
              material: r.material,
              deliveredOn: r.deliveredOn,
              fdis: fdisOf.get(r.id) ?? [fdi],
              dentistName: r.dentistName,
            }
          : null,
      parts,
      exams,
    });
  }
  // FDI order: quadrant by quadrant, from the midline out.
  implants.sort((a, b) => a.fdi - b.fdi);
  return {
    patient,
    practice,
    nextRecallOn: rows.nextRecallOn,
    implants,
    impressions: buildImpressions(rows.impressions),
  };
}
