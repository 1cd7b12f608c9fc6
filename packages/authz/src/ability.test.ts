// The role table of the product brief (shared/design/product.md, "Who uses it, and for what"),
// checked rule by rule against defineAbilityFor.
import { describe, expect, it } from 'vitest';
import { defineAbilityFor, subject, type Action, type Role, type Subject } from './index.js';

const PRACTICE = '11111111-1111-4111-8111-111111111111';
const OTHER = '22222222-2222-4222-8222-222222222222';
const SHARED_PATIENT = '33333333-3333-4333-8333-333333333333';
const UNSHARED_PATIENT = '44444444-4444-4444-8444-444444444444';

const user = (role: Role, shared: string[] = []) =>
  defineAbilityFor({
    id: 'u',
    role,
    practiceId: role === 'surgeon' ? OTHER : PRACTICE,
    sharedPatientIds: shared,
    shares: shared.map((patientId) => ({ patientId, scopes: ['placement', 'outcomes'], siteIds: null })),
  });
const row = (type: Exclude<Subject, 'all'>, fields: Record<string, string>) => subject(type, { ...fields });
const inPractice = { practiceId: PRACTICE, patientId: UNSHARED_PATIENT };

describe('restorative dentist', () => {
  const a = user('dentist');
  it.each<[Action, Exclude<Subject, 'all'>]>([
    ['create', 'Restoration'],
    ['amend', 'Restoration'],
    ['create', 'TorqueEvent'],
    ['amend', 'TorqueEvent'],
    ['create', 'ComponentInstance'],
    ['create', 'Share'],
    ['read', 'RecallExam'],
    ['read', 'Catalogue'],
    ['create', 'Complication'],
    ['create', 'Radiograph'],
    ['amend', 'Radiograph'],
  ])('may %s %s in their practice', (action, type) => {
    expect(a.can(action, row(type, inPractice))).toBe(true);
  });
  it('may not manage user accounts or edit the catalogue', () => {
    expect(a.can('create', 'User')).toBe(false);
    expect(a.can('update', row('Catalogue', inPractice))).toBe(false);
  });
  it('records and amends recall exams of their practice (dentists examine implants at their reviews)', () => {
    expect(a.can('create', row('RecallExam', inPractice))).toBe(true);
    expect(a.can('amend', row('RecallExam', inPractice))).toBe(true);
    expect(a.can('create', row('RecallExam', { practiceId: OTHER, patientId: UNSHARED_PATIENT }))).toBe(false);
  });
  it('sees nothing of another practice', () => {
    expect(a.can('read', row('Patient', { id: UNSHARED_PATIENT, practiceId: OTHER }))).toBe(false);
    expect(a.can('read', row('TorqueEvent', { practiceId: OTHER, patientId: UNSHARED_PATIENT }))).toBe(false);
  });
});

describe('dental hygienist', () => {
  const a = user('hygienist');
  it('runs recalls and files radiographs', () => {
    expect(a.can('create', row('RecallExam', inPractice))).toBe(true);
    expect(a.can('create', row('Radiograph', inPractice))).toBe(true);
  });
  it('reads but may not change restorations, components or torque records', () => {
    for (const type of ['Restoration', 'ComponentInstance', 'TorqueEvent'] as const) {
      expect(a.can('read', row(type, inPractice))).toBe(true);
      expect(a.can('create', row(type, inPractice))).toBe(false);
      expect(a.can('amend', row(type, inPractice))).toBe(false);
    }
    expect(a.can('update', row('Catalogue', inPractice))).toBe(false);
  });
});

describe('referring surgeon (another practice)', () => {
  const a = user('surgeon', [SHARED_PATIENT]);
  const shared = { practiceId: PRACTICE, patientId: SHARED_PATIENT };
  it('reads the shared patient and their implant record, and records placements', () => {
    expect(a.can('read', row('Patient', { id: SHARED_PATIENT, practiceId: PRACTICE }))).toBe(true);
    expect(a.can('read', row('RecallExam', shared))).toBe(true);
    expect(a.can('read', row('Radiograph', shared))).toBe(true);
    expect(a.can('create', row('Placement', shared))).toBe(true);
  });
  it('files and measures radiographs of a shared patient only (issue 10)', () => {
    expect(a.can('create', row('Radiograph', shared))).toBe(true);
    expect(a.can('amend', row('Radiograph', shared))).toBe(true);
    expect(a.can('create', row('Radiograph', { practiceId: PRACTICE, patientId: UNSHARED_PATIENT }))).toBe(false);
  });
  it('sees no patient that is not shared, nor the rest of the chart', () => {
    expect(a.can('read', row('Patient', { id: UNSHARED_PATIENT, practiceId: PRACTICE }))).toBe(false);
    expect(a.can('read', row('ImplantSite', { practiceId: PRACTICE, patientId: UNSHARED_PATIENT }))).toBe(false);
    expect(a.can('read', row('Share', shared))).toBe(false);
  });
  it('may not write restorations or torque entries even on a shared patient', () => {
    expect(a.can('create', row('Restoration', shared))).toBe(false);
    expect(a.can('create', row('TorqueEvent', shared))).toBe(false);
  });
  it('with no shares sees no other practice at all', () => {
    const none = user('surgeon');
    expect(none.can('read', row('Patient', { id: SHARED_PATIENT, practiceId: PRACTICE }))).toBe(false);
  });
});

describe('the audit trail (issue 11)', () => {
  const patientTrail = row('PatientAudit', inPractice);
  it("the practice admin reads the practice trail; the dentist and the admin read a patient's", () => {
    expect(user('practice_admin').can('read', row('AuditEntry', { practiceId: PRACTICE }))).toBe(true);
    expect(user('practice_admin').can('read', patientTrail)).toBe(true);
    expect(user('dentist').can('read', patientTrail)).toBe(true);
    expect(user('dentist').can('read', row('AuditEntry', { practiceId: PRACTICE }))).toBe(false);
  });
  it("nobody else, and never another practice's", () => {
    expect(user('hygienist').can('read', patientTrail)).toBe(false);
    expect(
      user('surgeon', [SHARED_PATIENT]).can(
        'read',
        row('PatientAudit', { practiceId: PRACTICE, patientId: SHARED_PATIENT }),
      ),
    ).toBe(false);
    expect(user('dentist').can('read', row('PatientAudit', { practiceId: OTHER, patientId: UNSHARED_PATIENT }))).toBe(
      false,
    );
  });
});

describe('records out (issue 14)', () => {
  const own = { practiceId: PRACTICE, patientId: SHARED_PATIENT };
  it("the FHIR export is the dentist's and the admin's; passport and card the dentist's", () => {
    expect(user('dentist').can('read', row('PatientExport', own))).toBe(true);
    expect(user('practice_admin').can('read', row('PatientExport', own))).toBe(true);
    expect(user('dentist').can('read', row('ImplantPassport', own))).toBe(true);
    expect(user('dentist').can('create', row('ImplantPassport', own))).toBe(true);
    expect(user('practice_admin').can('read', row('ImplantPassport', own))).toBe(false);
  });
  it("nobody else, not through a share, and never another practice's patient", () => {
    for (const kind of ['PatientExport', 'ImplantPassport'] as const) {
      expect(user('hygienist').can('read', row(kind, own))).toBe(false);
      expect(user('surgeon', [SHARED_PATIENT]).can('read', row(kind, own))).toBe(false);
      expect(user('dentist').can('read', row(kind, { practiceId: OTHER, patientId: UNSHARED_PATIENT }))).toBe(false);
    }
  });
});

describe('practice administrator', () => {
  const a = user('practice_admin');
  it('manages users, the catalogue and reads the audit trail', () => {
    expect(a.can('create', row('User', { practiceId: PRACTICE }))).toBe(true);
    expect(a.can('update', row('Catalogue', { practiceId: PRACTICE }))).toBe(true);
    expect(a.can('read', row('AuditEntry', { practiceId: PRACTICE }))).toBe(true);
  });
  it('may not edit clinical entries', () => {
    for (const type of [
      'ImplantSite',
      'Placement',
      'Restoration',
      'ComponentInstance',
      'TorqueEvent',
      'RecallExam',
      'Radiograph',
      'Complication',
      'Impression',
      'InsertChange',
    ] as const) {
      expect(a.can('create', row(type, inPractice))).toBe(false);
      expect(a.can('amend', row(type, inPractice))).toBe(false);
    }
  });
  it('administers only their own practice', () => {
    expect(a.can('create', row('User', { practiceId: OTHER }))).toBe(false);
  });
});

describe('impressions and their scan files', () => {
  const own = { practiceId: PRACTICE, patientId: UNSHARED_PATIENT };
  it('the dentist records and amends them; the hygienist and the administrator read them', () => {
    expect(user('dentist').can('create', row('Impression', own))).toBe(true);
    expect(user('dentist').can('amend', row('Impression', own))).toBe(true);
    expect(user('hygienist').can('read', row('Impression', own))).toBe(true);
    expect(user('hygienist').can('create', row('Impression', own))).toBe(false);
    expect(user('practice_admin').can('read', row('Impression', own))).toBe(true);
  });
  it('no share opens them to a surgeon, whatever its scope', () => {
    const shared = { practiceId: PRACTICE, patientId: SHARED_PATIENT };
    expect(user('surgeon', [SHARED_PATIENT]).can('read', row('Impression', shared))).toBe(false);
    expect(user('surgeon').can('read', row('Impression', { practiceId: OTHER }))).toBe(false);
  });
});

describe('retentive-insert changes (overdenture maintenance)', () => {
  const own = { practiceId: PRACTICE, patientId: UNSHARED_PATIENT };
  it('the dentist and the hygienist (at recall) record and amend them; the administrator reads them', () => {
    for (const role of ['dentist', 'hygienist'] as const)
      for (const action of ['read', 'create', 'amend'] as const)
        expect(user(role).can(action, row('InsertChange', own))).toBe(true);
    expect(user('practice_admin').can('read', row('InsertChange', own))).toBe(true);
    expect(user('surgeon').can('create', row('InsertChange', own))).toBe(false);
  });
  it('no share opens them to a surgeon, and no other practice sees them', () => {
    const shared = { practiceId: PRACTICE, patientId: SHARED_PATIENT };
    expect(user('surgeon', [SHARED_PATIENT]).can('read', row('InsertChange', shared))).toBe(false);
    expect(user('dentist').can('read', row('InsertChange', { practiceId: OTHER }))).toBe(false);
  });
});

describe('a share with a scope and chosen sites (issue 12)', () => {
  const SITE = '55555555-5555-4555-8555-555555555555';
  const OTHER_SITE = '66666666-6666-4666-8666-666666666666';
  const surgeon = (scopes: ('placement' | 'outcomes')[], siteIds: string[] | null) =>
    defineAbilityFor({
      id: 'u',
      role: 'surgeon',
      practiceId: OTHER,
      sharedPatientIds: [SHARED_PATIENT],
      shares: [{ patientId: SHARED_PATIENT, scopes, siteIds }],
    });
  const on = (siteId: string) => ({ practiceId: PRACTICE, patientId: SHARED_PATIENT, siteId });

  it('outcomes reads the shared sites but records no placement (a 403, the row being readable)', () => {
    const a = surgeon(['outcomes'], [SITE]);
    expect(a.can('read', row('Patient', { id: SHARED_PATIENT, practiceId: PRACTICE }))).toBe(true);
    expect(a.can('read', row('ImplantSite', { id: SITE, practiceId: PRACTICE, patientId: SHARED_PATIENT }))).toBe(true);
    for (const type of ['Placement', 'Restoration', 'RecallExam', 'Radiograph', 'Complication'] as const)
      expect(a.can('read', row(type, on(SITE)))).toBe(true);
    expect(a.can('create', row('Placement', on(SITE)))).toBe(false);
    expect(a.can('create', row('Radiograph', on(SITE)))).toBe(false);
  });

  it('placement records and amends the placement, and reads no restoration or recall', () => {
    const a = surgeon(['placement'], null);
    expect(a.can('create', row('Placement', on(SITE)))).toBe(true);
    expect(a.can('amend', row('Placement', on(OTHER_SITE)))).toBe(true);
    expect(a.can('read', row('Restoration', on(SITE)))).toBe(false);
    expect(a.can('read', row('RecallExam', on(SITE)))).toBe(false);
  });

  it('a site outside the share is not even readable (a 404)', () => {
    const a = surgeon(['placement', 'outcomes'], [SITE]);
    expect(a.can('read', row('ImplantSite', { id: OTHER_SITE, practiceId: PRACTICE, patientId: SHARED_PATIENT }))).toBe(
      false,
    );
    expect(a.can('read', row('Placement', on(OTHER_SITE)))).toBe(false);
    expect(a.can('create', row('Placement', on(OTHER_SITE)))).toBe(false);
    expect(a.can('read', row('RecallExam', { practiceId: PRACTICE, patientId: SHARED_PATIENT }))).toBe(false);
  });

  it('a share of one patient opens nothing of another', () => {
    const a = surgeon(['placement', 'outcomes'], null);
    expect(a.can('read', row('Placement', { practiceId: PRACTICE, patientId: UNSHARED_PATIENT, siteId: SITE }))).toBe(
      false,
    );
  });
});

describe('legacy import (docs/import.md)', () => {
  it('is run by the practice administrator and the dentist of the practice only', () => {
    for (const role of ['practice_admin', 'dentist'] as const) {
      expect(user(role).can('create', row('LegacyImport', { practiceId: PRACTICE }))).toBe(true);
      expect(user(role).can('create', row('LegacyImport', { practiceId: OTHER }))).toBe(false);
    }
    for (const role of ['hygienist', 'surgeon'] as const)
      expect(user(role).can('create', row('LegacyImport', { practiceId: PRACTICE }))).toBe(false);
  });
});
