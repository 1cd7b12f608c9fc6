// The FHIR mapping checked twice: by a general-purpose validator from the registry (the `fhir`
// package, against the R4 structure definitions and value sets) and against our own reading of
// the record, with the UDI fields read back through parseUdi.
import { gtinCheckDigit, parseUdi, GS } from '@torquetrail/domain';
import { describe, expect, it } from 'vitest';
import { CODE_SYSTEMS, COMPUTED_STATUS_NOTE, derivedId, gs1HumanReadable, patientBundle } from './fhir-bundle.js';
import type { RecordSnapshot, SnapshotImpression } from './record-snapshot.js';
import { bindingStrength, validatorErrors } from '../../test/support/fhir-validation.js';

const gtin13 = '0761234567890';
const GTIN = gtin13 + String(gtinCheckDigit(gtin13));
const AT = new Date('2026-12-02T10:00:00Z');

function snapshot(udi: string | null, impressions: SnapshotImpression[] = []): RecordSnapshot {
  return {
    impressions,
    patient: {
      id: '6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e01',
      chartNumber: 'ZZ-0001',
      givenName: 'Ada',
      familyName: 'Quill',
      birthDate: '1961-04-09',
      sex: 'female',
      email: 'ada@quill.example',
      phone: null,
      emailConsent: true,
    },
    practice: {
      id: '6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e02',
      name: 'Test Practice',
      dateFormat: 'day-month-year',
      phone: null,
      email: null,
      address: null,
    },
    nextRecallOn: '2027-01-10',
    implants: [
      {
        siteId: '6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e03',
        fdi: 36,
        placement: {
          id: '6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e04',
          placedOn: '2024-03-01',
          surgeonName: 'Dr Test Surgeon',
          systemName: 'Sys',
          manufacturer: 'Maker & Co <Ltd>',
          platformName: 'P 4.3',
          diameterMm: 4.3,
          connection: 'internal-conical',
          lengthMm: 10,
          lot: 'LOT7',
          udi,
        },
        restoration: {
          id: '6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e05',
          kind: 'single-crown',
          retention: 'screw-to-implant',
          material: 'zirconia',
          deliveredOn: '2024-07-01',
          fdis: [36],
          dentistName: null,
        },
        parts: [
          {
            id: '6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e06',
            kind: 'prosthetic-screw',
            name: 'Screw',
            referenceCode: 'S-1',
            manufacturer: 'Maker & Co <Ltd>',
            lot: 'S-LOT',
            installedOn: '2024-07-01',
            torqueSpecNcm: 30,
            tolerancePct: 10,
            seatingTorque: { appliedNcm: 30, performedAt: '2024-07-01T09:00:00.000Z', reason: 'initial-seating' },
            lastTorque: { appliedNcm: 30, performedAt: '2024-07-01T09:00:00.000Z', reason: 'initial-seating' },
          },
        ],
        exams: [
          {
            id: '6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e07',
            examinedOn: '2025-01-10',
            examinerName: 'Hy Gienist',
            probing: [
              { position: 'mesiobuccal', depthMm: 3.5, bleeding: true, suppuration: false },
              { position: 'buccal', depthMm: 2, bleeding: false, suppuration: false },
            ],
            boneLevelMm: 1.2,
            status: 'mucositis',
            rulesVersion: '1.0.0',
          },
        ],
      },
    ],
  };
}

type Res = { resourceType: string; id: string } & Record<string, unknown>;
const resources = (b: ReturnType<typeof patientBundle>) => (b.entry as { resource: Res }[]).map((e) => e.resource);

describe('FHIR R4 bundle of one patient', () => {
  it('is validator-clean (no error; warnings only for our documented codes under non-required bindings) with and without a UDI', () => {
    const udi = `(01)${GTIN}(17)290300(10)LOT7(21)SN-42`;
    for (const s of [snapshot(udi), snapshot(null)]) {
      const bundle = patientBundle(s, AT);
      expect(validatorErrors(bundle)).toEqual([]);
      expect(bundle.type).toBe('collection');
    }
  });

  it('a validator that is handed a broken resource does complain (the check can fail)', () => {
    const bundle = patientBundle(snapshot(null), AT);
    const [patient, device] = resources(bundle);
    patient.gender = 'sometimes';
    device.colour = 'blue';
    expect(validatorErrors(bundle).map((m) => m.location)).toEqual(['Patient.gender', 'Device.colour']);
  });

  it('reads binding strengths from the validator definitions', () => {
    expect(bindingStrength('Patient.gender')).toBe('required');
    expect(bindingStrength('Observation.component[3].code')).toBe('example');
    expect(bindingStrength('Procedure.focalDevice[0].action')).toBe('preferred');
  });

  it('round-trips the UDI: carrierHRF parses back to the device identifier, lot, serial and expiry', () => {
    for (const raw of [
      `(01)${GTIN}(17)290300(10)LOT7(21)SN-42`,
      `]d201${GTIN}17290315${GS}10LOT7${GS}21SN-42`,
      `01${GTIN}11240101`,
    ]) {
      const device = resources(patientBundle(snapshot(raw), AT)).find((r) => r.resourceType === 'Device')!;
      const carrier = (device.udiCarrier as { deviceIdentifier: string; issuer: string; carrierHRF: string }[])[0];
      const original = parseUdi(raw, AT);
      const back = parseUdi(carrier.carrierHRF, AT);
      expect(back).toEqual(original);
      expect(carrier.deviceIdentifier).toBe(original.gtin);
      expect(carrier.issuer).toBe('http://hl7.org/fhir/NamingSystem/gs1-di');
      expect(device.serialNumber).toBe(original.serial);
      expect(device.expirationDate).toBe(original.expiry);
      expect(device.lotNumber).toBe('LOT7');
    }
  });

  it('rebuilds the GS1 human-readable form in AI order, DD = 00 read as the month end', () => {
    expect(gs1HumanReadable(parseUdi(`01${GTIN}17290200${GS}10A`, AT))).toBe(`(01)${GTIN}(17)290228(10)A`);
  });

  it('an unreadable stored UDI leaves the carrier out but keeps the lot', () => {
    const device = resources(patientBundle(snapshot('not a udi'), AT)).find((r) => r.resourceType === 'Device')!;
    expect(device.udiCarrier).toBeUndefined();
    expect(device.lotNumber).toBe('LOT7');
  });

  it('has the Patient, a Device per implant and part, Procedures with FDI body sites, mm Observations', () => {
    const all = resources(patientBundle(snapshot(null), AT));
    expect(all.map((r) => r.resourceType)).toEqual([
      'Patient',
      'Device',
      'Device',
      'Procedure',
      'Observation',
      'Observation',
      'Observation',
      'Procedure',
    ]);
    const placement = all.find(
      (r) => r.id === derivedId('placement-procedure', '6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e04'),
    )!;
    expect(placement.bodySite).toEqual([
      expect.objectContaining({ coding: [{ system: CODE_SYSTEMS.fdiTeeth, code: '36', display: 'FDI 36' }] }),
    ]);
    expect(placement.performer).toEqual([{ actor: { display: 'Dr Test Surgeon' } }]);
    expect(placement.focalDevice).toEqual([
      {
        action: {
          coding: [{ system: CODE_SYSTEMS.deviceAction, code: 'implanted', display: 'Implanted' }],
          text: 'Implanted',
        },
        manipulated: { reference: 'urn:uuid:6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e04' },
      },
    ]);
    const delivery = all.at(-1)!;
    expect(delivery.performedDateTime).toBe('2024-07-01');
    expect(delivery.performer).toBeUndefined();
    const bone = all.find((r) => r.id === derivedId('bone-level', '6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e07'))!;
    expect(bone.valueQuantity).toEqual({ value: 1.2, unit: 'mm', system: 'http://unitsofmeasure.org', code: 'mm' });
    const status = all.find((r) => r.id === derivedId('peri-implant-status', '6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e07'))!;
    expect((status.text as { div: string }).div).toContain('not a diagnosis');
    expect(status.note).toEqual([{ text: COMPUTED_STATUS_NOTE }]);
  });

  it('an impression: Procedure on the day taken, inactive Devices for its scan bodies, a DocumentReference per scan file', () => {
    const digital: SnapshotImpression = {
      id: '6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e10',
      restorationId: '6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e05',
      method: 'digital',
      takenOn: '2024-05-02',
      recordedByName: 'Dr Test Dentist',
      fdis: [36],
      parts: [
        {
          id: '6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e11',
          fdi: 36,
          kind: 'scan-body',
          name: 'Scan body <SB>',
          referenceCode: 'SB-1',
          manufacturer: 'Maker & Co <Ltd>',
          copingLevel: 'implant',
          lot: 'SB-LOT',
        },
      ],
      files: [
        {
          id: '6d1f1c2e-8a4b-4c4e-9f4e-0a0b0c0d0e12',
          fileType: 'ply',
          originalName: null,
          sizeBytes: 2048,
          sha256: 'ab'.repeat(32),
          uploadedAt: '2024-05-02T10:00:00.000Z',
        },
      ],
    };
    const bundle = patientBundle(snapshot(null, [digital]), AT);
    expect(validatorErrors(bundle)).toEqual([]);
    const all = resources(bundle);
    expect(all.slice(-3).map((r) => r.resourceType)).toEqual(['Procedure', 'Device', 'DocumentReference']);
    const [procedure, device, document] = all.slice(-3);
    expect(procedure).toMatchObject({
      id: derivedId('impression-procedure', digital.id),
      performedDateTime: '2024-05-02',
      performer: [{ actor: { display: 'Dr Test Dentist' } }],
      report: [{ reference: `urn:uuid:${digital.files[0].id}` }],
      focalDevice: [{ manipulated: { reference: `urn:uuid:${device.id}` } }],
    });
    expect(device).toMatchObject({ status: 'inactive', lotNumber: 'SB-LOT', modelNumber: 'SB-1' });
    // PLY has no registered media type: it travels as bytes, named by its title.
    expect(document).toMatchObject({
      content: [{ attachment: { contentType: 'application/octet-stream', size: 2048, title: 'scan-6d1f1c2e.ply' } }],
      identifier: [{ system: CODE_SYSTEMS.sha256, value: 'ab'.repeat(32) }],
    });
  });
});
