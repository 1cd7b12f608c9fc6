// One patient's implant record as a FHIR R4 Bundle of type `collection`. A pure mapping of the
// snapshot (no I/O, no clock: the export time is passed in), so the same record always gives the
// same Bundle. Every code system used here and where it comes from: docs/fhir.md.
import { createHash } from 'node:crypto';
import { fdiToUniversal, parseUdi, type ParsedUdi } from '@torquetrail/domain';
import type {
  RecordSnapshot,
  SnapshotExam,
  SnapshotImplant,
  SnapshotImpression,
  SnapshotPart,
  SnapshotPatient,
  SnapshotRestoration,
} from './record-snapshot.js';
import { deviceKindWords, partKindWords, probingWords, statusWords } from './plain-words.js';

/** Code systems (docs/fhir.md names the source of each). */
export const CODE_SYSTEMS = Object.freeze({
  gs1Di: 'http://hl7.org/fhir/NamingSystem/gs1-di',
  deviceAction: 'http://hl7.org/fhir/device-action',
  fdiTeeth: 'http://hl7.org/fhir/ex-fdi',
  ucum: 'http://unitsofmeasure.org',
  observationCategory: 'http://terminology.hl7.org/CodeSystem/observation-category',
  deviceKind: 'https://fhir.torquetrail.example/CodeSystem/device-kind',
  procedure: 'https://fhir.torquetrail.example/CodeSystem/procedure',
  observation: 'https://fhir.torquetrail.example/CodeSystem/observation',
  probingPosition: 'https://fhir.torquetrail.example/CodeSystem/probing-position',
  periImplantStatus: 'https://fhir.torquetrail.example/CodeSystem/peri-implant-status',
  chartNumber: 'https://fhir.torquetrail.example/NamingSystem/chart-number',
  documentKind: 'https://fhir.torquetrail.example/CodeSystem/document-kind',
  sha256: 'https://fhir.torquetrail.example/NamingSystem/sha256',
});

/**
 * What happened to a device in a procedure, from HL7's device-action code system. R4's preferred
 * binding is a SNOMED CT value set (is-a 129264002 Action), which needs a SNOMED licence; a
 * preferred binding allows another code system, so validators note it as a warning only.
 */
const IMPLANTED = {
  coding: [{ system: CODE_SYSTEMS.deviceAction, code: 'implanted', display: 'Implanted' }],
  text: 'Implanted',
};

export const COMPUTED_STATUS_NOTE =
  'Computed by Torquetrail from this exam with the published case definitions (rules version shown); not a diagnosis.';

type Json = Record<string, unknown>;
interface Entry {
  fullUrl: string;
  resource: Json & { resourceType: string; id: string };
}

/** A stable UUID for a resource derived from a record (name-based, SHA-1, RFC 4122 version 5 layout). */
export function derivedId(kind: string, recordId: string): string {
  const h = createHash('sha1').update(`torquetrail:${kind}:${recordId}`).digest();
  h[6] = (h[6] & 0x0f) | 0x50;
  h[8] = (h[8] & 0x3f) | 0x80;
  const x = h.subarray(0, 16).toString('hex');
  return `${x.slice(0, 8)}-${x.slice(8, 12)}-${x.slice(12, 16)}-${x.slice(16, 20)}-${x.slice(20, 32)}`;
}

const ref = (id: string) => ({ reference: `urn:uuid:${id}` });
const entry = (resource: Entry['resource']): Entry => ({ fullUrl: `urn:uuid:${resource.id}`, resource });
const mm = (value: number) => ({ value, unit: 'mm', system: CODE_SYSTEMS.ucum, code: 'mm' });
const escapeXml = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
const narrative = (text: string) => ({
  status: 'generated',
  div: `<div xmlns="http://www.w3.org/1999/xhtml">${escapeXml(text)}</div>`,
});

/** The tooth as an ISO 3950 (FDI) code, with its Universal number in the text. */
function toothSite(fdi: number) {
  return {
    coding: [{ system: CODE_SYSTEMS.fdiTeeth, code: String(fdi), display: `FDI ${fdi}` }],
    text: `Tooth ${fdi} (ISO 3950 / FDI), ${fdiToUniversal(fdi)} in the Universal numbering`,
  };
}

/**
 * The GS1 human-readable form of a parsed UDI, rebuilt from its elements in the order
 * (01), (11), (17), (10), (21): what `carrierHRF` carries, and what parseUdi reads back.
 */
export function gs1HumanReadable(udi: ParsedUdi): string {
  const yymmdd = (iso: string) => iso.slice(2, 4) + iso.slice(5, 7) + iso.slice(8, 10);
  return [
    `(01)${udi.gtin}`,
    udi.productionDate ? `(11)${yymmdd(udi.productionDate)}` : '',
    udi.expiry ? `(17)${yymmdd(udi.expiry)}` : '',
    udi.lot ? `(10)${udi.lot}` : '',
    udi.serial ? `(21)${udi.serial}` : '',
  ].join('');
}

/** The stored UDI parsed, or null when it is absent or does not parse (the lot is still exported). */
function parsedUdi(udi: string | null, exportedAt: Date): ParsedUdi | null {
  if (!udi) return null;
  try {
    return parseUdi(udi, exportedAt);
  } catch {
    return null;
  }
}

function patientResource(p: SnapshotPatient, practiceName: string): Entry['resource'] {
  const telecom = [
    ...(p.phone ? [{ system: 'phone', value: p.phone }] : []),
    ...(p.email ? [{ system: 'email', value: p.email }] : []),
  ];
  return {
    resourceType: 'Patient',
    id: p.id,
    identifier: [{ system: CODE_SYSTEMS.chartNumber, value: p.chartNumber, assigner: { display: practiceName } }],
    name: [{ family: p.familyName, given: [p.givenName] }],
    // FHIR administrative gender: "not recorded" is `unknown`.
    gender: p.sex === 'not-recorded' ? 'unknown' : p.sex,
    birthDate: p.birthDate,
    ...(telecom.length > 0 ? { telecom } : {}),
  };
}

function implantDevice(patientId: string, implant: SnapshotImplant, exportedAt: Date): Entry['resource'] {
  const pl = implant.placement;
  const udi = parsedUdi(pl.udi, exportedAt);
  const name = `${pl.systemName} ${pl.platformName}, ${pl.diameterMm} × ${pl.lengthMm} mm`;
  return {
    resourceType: 'Device',
    id: pl.id,
    ...(udi
      ? {
          udiCarrier: [
            {
              deviceIdentifier: udi.gtin,
              issuer: CODE_SYSTEMS.gs1Di,
              carrierHRF: gs1HumanReadable(udi),
              entryType: 'barcode',
            },
          ],
        }
      : {}),
    status: 'active',
    manufacturer: pl.manufacturer,
    ...(udi?.expiry ? { expirationDate: udi.expiry } : {}),
    ...((pl.lot ?? udi?.lot) ? { lotNumber: pl.lot ?? udi?.lot } : {}),
    ...(udi?.serial ? { serialNumber: udi.serial } : {}),
    deviceName: [{ name, type: 'user-friendly-name' }],
    type: {
      coding: [{ system: CODE_SYSTEMS.deviceKind, code: 'dental-implant', display: deviceKindWords('dental-implant') }],
      text: `Dental implant at site ${implant.fdi} (FDI)`,
    },
    patient: ref(patientId),
  };
}

function partDevice(patientId: string, fdi: number, part: SnapshotPart): Entry['resource'] {
  return {
    resourceType: 'Device',
    id: part.id,
    status: 'active',
    manufacturer: part.manufacturer,
    ...(part.lot ? { lotNumber: part.lot } : {}),
    deviceName: [{ name: part.name, type: 'user-friendly-name' }],
    modelNumber: part.referenceCode,
    type: {
      coding: [{ system: CODE_SYSTEMS.deviceKind, code: part.kind, display: partKindWords(part.kind) }],
      text: `${partKindWords(part.kind)} at site ${fdi} (FDI)`,
    },
    patient: ref(patientId),
  };
}

const performer = (name: string | null) => (name ? { performer: [{ actor: { display: name } }] } : {});

function placementProcedure(patientId: string, implant: SnapshotImplant): Entry['resource'] {
  const pl = implant.placement;
  return {
    resourceType: 'Procedure',
    id: derivedId('placement-procedure', pl.id),
    status: 'completed',
    code: {
      coding: [{ system: CODE_SYSTEMS.procedure, code: 'implant-placement', display: 'Dental implant placement' }],
      text: 'Dental implant placement',
    },
    subject: ref(patientId),
    performedDateTime: pl.placedOn,
    ...performer(pl.surgeonName),
    bodySite: [toothSite(implant.fdi)],
    focalDevice: [
      {
        action: IMPLANTED,
        manipulated: ref(pl.id),
      },
    ],
  };
}

function deliveryProcedure(patientId: string, r: SnapshotRestoration, parts: SnapshotPart[]): Entry['resource'] {
  return {
    resourceType: 'Procedure',
    id: derivedId('delivery-procedure', r.id),
    status: 'completed',
    code: {
      coding: [
        { system: CODE_SYSTEMS.procedure, code: 'restoration-delivery', display: 'Implant restoration delivery' },
      ],
      text: `Implant restoration delivered (${r.kind}, ${r.retention})`,
    },
    subject: ref(patientId),
    performedDateTime: r.deliveredOn,
    ...performer(r.dentistName),
    bodySite: r.fdis.map(toothSite),
    ...(parts.length > 0
      ? {
          focalDevice: parts.map((p) => ({
            action: IMPLANTED,
            manipulated: ref(p.id),
          })),
        }
      : {}),
  };
}

/**
 * The copings or scan bodies an impression was taken with: handled in the mouth for the impression
 * and taken out again (device-action `manipulated`), so their Devices are `inactive`.
 */
const MANIPULATED = {
  coding: [{ system: CODE_SYSTEMS.deviceAction, code: 'manipulated', display: 'Manipulated' }],
  text: 'Used for the impression and removed',
};

/** IANA media types of the scan files; PLY has none registered, so it travels as bytes. */
const SCAN_MEDIA_TYPES = { stl: 'model/stl', obj: 'model/obj', ply: 'application/octet-stream' } as const;

function impressionPartDevice(patientId: string, part: SnapshotImpression['parts'][number]): Entry['resource'] {
  return {
    resourceType: 'Device',
    id: derivedId('impression-part', part.id),
    status: 'inactive',
    manufacturer: part.manufacturer,
    ...(part.lot ? { lotNumber: part.lot } : {}),
    deviceName: [{ name: part.name, type: 'user-friendly-name' }],
    modelNumber: part.referenceCode,
    type: {
      coding: [{ system: CODE_SYSTEMS.deviceKind, code: part.kind, display: partKindWords(part.kind) }],
      text: `${partKindWords(part.kind)} at site ${part.fdi} (FDI)${part.copingLevel === 'multi-unit' ? ', on a multi-unit abutment' : part.copingLevel === 'implant' ? ', implant level' : ''}`,
    },
    patient: ref(patientId),
  };
}

function scanFileDocument(
  patientId: string,
  i: SnapshotImpression,
  file: SnapshotImpression['files'][number],
): Entry['resource'] {
  const format = file.fileType.toUpperCase();
  return {
    resourceType: 'DocumentReference',
    id: file.id,
    identifier: [{ system: CODE_SYSTEMS.sha256, value: file.sha256 }],
    status: 'current',
    type: {
      coding: [{ system: CODE_SYSTEMS.documentKind, code: 'intraoral-scan', display: 'Intraoral scan (3D mesh)' }],
      text: `Intraoral scan, ${format} mesh`,
    },
    subject: ref(patientId),
    date: file.uploadedAt,
    description: 'Scan file of the digital impression',
    content: [
      {
        attachment: {
          contentType: SCAN_MEDIA_TYPES[file.fileType],
          size: file.sizeBytes,
          title: file.originalName ?? `scan-${file.id.slice(0, 8)}.${file.fileType}`,
          creation: file.uploadedAt,
        },
      },
    ],
    context: { related: [ref(derivedId('impression-procedure', i.id))] },
  };
}

function impressionProcedure(patientId: string, i: SnapshotImpression): Entry['resource'] {
  const text =
    i.method === 'digital'
      ? 'Digital implant impression (intraoral scan with scan bodies)'
      : 'Analog implant impression (impression copings and tray)';
  return {
    resourceType: 'Procedure',
    id: derivedId('impression-procedure', i.id),
    status: 'completed',
    code: {
      coding: [{ system: CODE_SYSTEMS.procedure, code: `implant-impression-${i.method}`, display: text }],
      text,
    },
    subject: ref(patientId),
    performedDateTime: i.takenOn,
    ...performer(i.recordedByName),
    bodySite: i.fdis.map(toothSite),
    ...(i.files.length > 0 ? { report: i.files.map((f) => ref(f.id)) } : {}),
    ...(i.parts.length > 0
      ? {
          focalDevice: i.parts.map((p) => ({
            action: MANIPULATED,
            manipulated: ref(derivedId('impression-part', p.id)),
          })),
        }
      : {}),
  };
}

/** An impression: its Procedure, a Device per coping or scan body, a DocumentReference per scan file. */
function impressionEntries(patientId: string, i: SnapshotImpression): Entry[] {
  return [
    entry(impressionProcedure(patientId, i)),
    ...i.parts.map((p) => entry(impressionPartDevice(patientId, p))),
    ...i.files.map((f) => entry(scanFileDocument(patientId, i, f))),
  ];
}

const examCategory = [{ coding: [{ system: CODE_SYSTEMS.observationCategory, code: 'exam', display: 'Exam' }] }];
const obsCode = (code: string, display: string) => ({
  coding: [{ system: CODE_SYSTEMS.observation, code, display }],
  text: display,
});

function examObservations(patientId: string, fdi: number, exam: SnapshotExam): Entry['resource'][] {
  const common = {
    status: 'final',
    category: examCategory,
    subject: ref(patientId),
    effectiveDateTime: exam.examinedOn,
    performer: [{ display: exam.examinerName }],
    bodySite: toothSite(fdi),
  };
  const out: Entry['resource'][] = [];
  if (exam.probing.length > 0) {
    out.push({
      resourceType: 'Observation',
      id: derivedId('probing', exam.id),
      ...common,
      code: obsCode('peri-implant-probing', 'Peri-implant probing depths'),
      component: exam.probing.flatMap((p) => [
        {
          code: obsCode(`pd-${p.position}`, `Probing depth, ${probingWords(p.position)}`),
          valueQuantity: mm(p.depthMm),
        },
        {
          code: obsCode(`bop-${p.position}`, `Bleeding on probing, ${probingWords(p.position)}`),
          valueBoolean: p.bleeding,
        },
        { code: obsCode(`sup-${p.position}`, `Suppuration, ${probingWords(p.position)}`), valueBoolean: p.suppuration },
      ]),
    });
  }
  if (exam.boneLevelMm !== null) {
    out.push({
      resourceType: 'Observation',
      id: derivedId('bone-level', exam.id),
      ...common,
      code: obsCode('radiographic-bone-level', 'Radiographic bone level (mm apical to the implant reference)'),
      valueQuantity: mm(exam.boneLevelMm),
    });
  }
  const words = `Peri-implant status ${statusWords(exam.status)} at site ${fdi} (FDI). ${COMPUTED_STATUS_NOTE} Rules version ${exam.rulesVersion}.`;
  out.push({
    resourceType: 'Observation',
    id: derivedId('peri-implant-status', exam.id),
    text: narrative(words),
    ...common,
    code: obsCode('computed-peri-implant-status', 'Computed peri-implant status (not a diagnosis)'),
    valueCodeableConcept: {
      coding: [{ system: CODE_SYSTEMS.periImplantStatus, code: exam.status, display: statusWords(exam.status) }],
      text: `${statusWords(exam.status)} (computed, not a diagnosis)`,
    },
    method: { text: `Torquetrail rules version ${exam.rulesVersion}` },
    note: [{ text: COMPUTED_STATUS_NOTE }],
    derivedFrom: [
      ...(exam.probing.length > 0 ? [ref(derivedId('probing', exam.id))] : []),
      ...(exam.boneLevelMm !== null ? [ref(derivedId('bone-level', exam.id))] : []),
    ],
  });
  return out;
}

/** The Bundle (type `collection`) of one patient's implant record. */
export function patientBundle(snapshot: RecordSnapshot, exportedAt: Date): Json {
  const { patient } = snapshot;
  const entries: Entry[] = [entry(patientResource(patient, snapshot.practice.name))];
  const delivered = new Map<string, { restoration: SnapshotRestoration; parts: SnapshotPart[] }>();
  for (const implant of snapshot.implants) {
    entries.push(entry(implantDevice(patient.id, implant, exportedAt)));
    const retained = implant.parts.filter((p) => p.kind !== 'impression-coping');
    for (const part of retained) entries.push(entry(partDevice(patient.id, implant.fdi, part)));
    entries.push(entry(placementProcedure(patient.id, implant)));
    if (implant.restoration) {
      const r = implant.restoration;
      const seen = delivered.get(r.id) ?? { restoration: r, parts: [] };
      seen.parts.push(...retained);
      delivered.set(r.id, seen);
    }
    for (const exam of implant.exams) entries.push(...examObservations(patient.id, implant.fdi, exam).map(entry));
  }
  for (const { restoration, parts } of delivered.values())
    entries.push(entry(deliveryProcedure(patient.id, restoration, parts)));
  for (const impression of snapshot.impressions) entries.push(...impressionEntries(patient.id, impression));
  return {
    resourceType: 'Bundle',
    id: derivedId('bundle', `${patient.id}:${exportedAt.toISOString()}`),
    meta: { lastUpdated: exportedAt.toISOString() },
    type: 'collection',
    timestamp: exportedAt.toISOString(),
    entry: entries,
  };
}
