// Pure parts of the Site file: the Timeline order. (The re-torque reminder, retorqueDueAt, is a
// clinical rule: it is tested with its source in packages/domain/src/retorque.test.ts.)
import { describe, expect, it } from 'vitest';
import { buildTimeline, type TimelineRows } from './timeline.js';

const at = (iso: string) => new Date(iso);

const empty: TimelineRows = {
  placements: [],
  restorations: [],
  parts: [],
  torque: [],
  complications: [],
  recallExams: [],
  radiographs: [],
  measurements: [],
  seatingChecks: [],
  referralSummaries: [],
  passportMails: [],
  freeTextParts: [],
  impressions: [],
  insertChanges: [],
  importMarks: [],
};
const torque = (id: string, performedAt: string, amended = false) => ({
  id,
  componentInstanceId: 'p1',
  partName: 'Screw',
  appliedNcm: 25,
  specNcm: 25,
  tolerancePct: 10,
  verdict: 'within' as const,
  reason: 're-torque-at-recall' as const,
  wrenchLabel: null,
  wrenchCalibrationOverdue: false,
  earlySettlingConfirmed: false,
  performedAt: at(performedAt),
  recordedAt: at(amended ? '2020-01-01T00:00:00Z' : '2020-01-02T00:00:00Z'),
  byName: null,
  supersedesId: null,
  amendmentReason: null,
  amended,
});

describe('buildTimeline', () => {
  it('charts each insert change with the strengths the catalogue states, an amended one kept and marked', () => {
    const part = (retentionLabel: string, retentionN: number | null) => ({
      name: `Insert, ${retentionLabel}`,
      retentionLabel,
      retentionN,
    });
    const change = {
      id: 'i1',
      changedOn: '2025-03-10',
      reason: 'retention-loss',
      notes: 'Denture lifts when chewing',
      supersedesId: null,
      amendmentReason: null,
      recordedByName: 'Hygienist',
      recordedAt: at('2025-03-10T09:00:00Z'),
      amended: true,
      oldPart: part('medium', 13),
      newPart: part('strong', null),
    };
    const amendment = {
      ...change,
      id: 'i2',
      supersedesId: 'i1',
      amendmentReason: 'Wrong strength',
      recordedAt: at('2025-03-11T09:00:00Z'),
      amended: false,
      oldPart: null,
    };
    const events = buildTimeline('s', { ...empty, insertChanges: [amendment, change] }).events;
    expect(events.map((e) => [e.id, e.kind, e.amended])).toEqual([
      ['i1', 'insert-change', true],
      ['i2', 'insert-change', false],
    ]);
    expect(events[0].title).toBe('Retentive insert changed: medium, 13 N → strong (retention loss)');
    expect(events[1].title).toBe('Insert change (amended record): strong (retention loss)');
    expect(events[0].detail).toBe('Denture lifts when chewing');
  });
  it('folds the parts an insert change took out and put in into its entry; a part an amendment corrected is told there', () => {
    const insert = (id: string, name: string, over: Partial<TimelineRows['parts'][number]>) => ({
      id,
      kind: 'retentive-insert' as const,
      name,
      referenceCode: `RI-${id}`,
      torqueSpecNcm: null,
      tolerancePct: 10,
      lot: null,
      installedOn: '2025-03-10',
      removedOn: null,
      replacesId: null,
      insertChangeId: null,
      enteredInErrorReason: null,
      byName: null,
      ...over,
    });
    const change = {
      id: 'i1',
      changedOn: '2025-03-10',
      reason: 'wear',
      notes: null,
      supersedesId: null,
      amendmentReason: null,
      recordedByName: null,
      recordedAt: at('2025-03-10T09:00:00Z'),
      amended: true,
      oldPart: { name: 'Insert, medium', retentionLabel: 'medium', retentionN: 13 },
      newPart: { name: 'Insert, light', retentionLabel: 'light', retentionN: 7 },
    };
    const amendment = {
      ...change,
      id: 'i2',
      supersedesId: 'i1',
      amendmentReason: 'A strong insert was fitted',
      recordedAt: at('2025-03-11T09:00:00Z'),
      amended: false,
      newPart: { name: 'Insert, strong', retentionLabel: 'strong', retentionN: 20 },
    };
    const rows: TimelineRows = {
      ...empty,
      parts: [
        // Fitted at delivery (no insert change), taken out by the change.
        insert('p0', 'Insert, medium', { installedOn: '2024-01-05', removedOn: '2025-03-10' }),
        insert('p1', 'Insert, light', {
          replacesId: 'p0',
          insertChangeId: 'i1',
          enteredInErrorReason: 'A strong insert was fitted',
        }),
        insert('p2', 'Insert, strong', { replacesId: 'p0', insertChangeId: 'i2' }),
      ],
      insertChanges: [amendment, change],
    };
    const events = buildTimeline('s', rows).events;
    // One entry per change: no "Removed" or "Replacement installed" beside it; the delivery's insert stays.
    expect(events.map((e) => e.key)).toEqual(['part:p0:in', 'insert-change:i1', 'insert-change:i2']);
    expect(events[1].detail).toBe(
      'Insert, light entered in error in the Stack, corrected by the amendment (A strong insert was fitted)',
    );
    expect(events[2].detail).toBe('Stack: Insert, strong fitted in place of Insert, medium');
  });
  it('orders by day, then the order of a sitting (complication before its torque), then time', () => {
    const rows: TimelineRows = {
      ...empty,
      torque: [torque('t2', '2016-05-10T09:41:00Z'), torque('t1', '2016-05-10T09:30:00Z')],
      complications: [
        {
          id: 'c1',
          kind: 'screw-loosening',
          occurredOn: '2016-05-10',
          notes: null,
          componentInstanceId: null,
          partName: null,
          byName: null,
          recordedAt: at('2016-05-10T10:00:00Z'),
          supersedesId: null,
          amendmentReason: null,
          amended: false,
        },
      ],
      recallExams: [
        {
          id: 'e1',
          examinedOn: '2015-01-01',
          status: 'health',
          boneLevelMm: null,
          byName: null,
          supersedesId: null,
          amendmentReason: null,
          amended: false,
        },
      ],
    };
    expect(buildTimeline('s', rows).events.map((e) => e.id)).toEqual(['e1', 'c1', 't1', 't2']);
    expect(buildTimeline('s', rows, ['torque']).events.map((e) => e.id)).toEqual(['t1', 't2']);
  });
  it('keeps amended torque entries in the events but not in the chart series', () => {
    const rows: TimelineRows = {
      ...empty,
      parts: [
        {
          id: 'p1',
          kind: 'prosthetic-screw',
          name: 'Screw',
          referenceCode: 'X',
          torqueSpecNcm: 25,
          tolerancePct: 10,
          lot: null,
          installedOn: '2016-01-01',
          removedOn: null,
          replacesId: null,
          insertChangeId: null,
          enteredInErrorReason: null,
          byName: null,
        },
      ],
      torque: [torque('new', '2016-05-10T09:30:00Z'), torque('old', '2016-05-10T09:30:00Z', true)],
    };
    const t = buildTimeline('s', rows);
    expect(t.events.filter((e) => e.kind === 'torque').map((e) => [e.id, e.amended])).toEqual([
      ['old', true],
      ['new', false],
    ]);
    expect(t.torqueSeries[0].points.map((p) => p.id)).toEqual(['new']);
  });
  it('puts the radiograph of a recall day after the exam and the bone levels after the radiograph; an entered-in-error one stays, marked', () => {
    const rows: TimelineRows = {
      ...empty,
      recallExams: [
        {
          id: 'e1',
          examinedOn: '2023-05-16',
          status: 'peri-implantitis',
          boneLevelMm: 3.4,
          byName: null,
          supersedesId: null,
          amendmentReason: null,
          amended: false,
        },
      ],
      measurements: [
        {
          id: 'm1',
          radiographId: 'x1',
          mesialMm: 3.4,
          distalMm: 2.95,
          measuredAt: at('2023-05-16T11:30:00Z'),
          takenOn: '2023-05-16',
          enteredInErrorReason: null,
          byName: 'Maren Holt',
          supersedesId: null,
          amendmentReason: null,
          amended: false,
        },
      ],
      radiographs: [
        {
          id: 'x1',
          kind: 'periapical',
          fileType: 'dicom',
          takenOn: '2023-05-16',
          uploadedAt: at('2023-05-16T11:15:00Z'),
          note: null,
          enteredInErrorReason: null,
          byName: 'Maren Holt',
        },
        {
          id: 'x2',
          kind: 'cbct-export',
          fileType: 'png',
          takenOn: null,
          uploadedAt: at('2024-01-02T08:00:00Z'),
          note: null,
          enteredInErrorReason: 'Another patient',
          byName: null,
        },
      ],
    };
    const events = buildTimeline('s', rows).events;
    expect(events.map((e) => [e.kind, e.id])).toEqual([
      ['recall-exam', 'e1'],
      ['radiograph', 'x1'],
      ['bone-level', 'm1'],
      ['radiograph', 'x2'],
    ]);
    expect(events[2]).toMatchObject({ title: 'Bone level measured: mesial 3.4 mm, distal 3.0 mm', radiographId: 'x1' });
    expect(events[3]).toMatchObject({
      title: 'Radiograph (entered in error): cbct export',
      dateOnly: false,
      enteredInErrorReason: 'Another patient',
    });
  });

  it('marks the entries a legacy import wrote with their file and row, and shows free-text parts', () => {
    const rows: TimelineRows = {
      ...empty,
      torque: [torque('t1', '2016-05-10T09:30:00Z'), torque('t2', '2016-06-10T09:30:00Z')],
      freeTextParts: [{ id: 'f1', partRef: 'OLD-77', partName: 'Old abutment', lot: 'L9', installedOn: '2016-05-01' }],
      importMarks: [
        { recordId: 't1', fileName: 'history.csv', rowNumber: 12 },
        { recordId: 'f1', fileName: 'history.csv', rowNumber: 11 },
      ],
    };
    const events = buildTimeline('s', rows).events;
    expect(events.map((e) => [e.id, e.importedFrom])).toEqual([
      ['f1', 'history.csv, row 11'],
      ['t1', 'history.csv, row 12'],
      ['t2', null],
    ]);
    expect(events[0]).toMatchObject({ kind: 'imported-part', title: 'Part not in the catalogue: Old abutment' });
  });
});

describe('recorded impressions on the Timeline', () => {
  it('shows a digital impression on its day with its scan bodies and files, and an amendment as amended', () => {
    const impression = (id: string, supersedesId: string | null, amended: boolean) => ({
      id,
      restorationId: 'r1',
      method: 'digital' as const,
      takenOn: '2026-11-20',
      note: null,
      byName: 'Dr Invented',
      supersedesId,
      amendmentReason: supersedesId ? 'Lot misread' : null,
      amended,
      scanBodies: ['15: Scan body lot SB-1', '16: Scan body lot SB-2'],
      scanFileCount: 1,
    });
    const reply = buildTimeline('s1', {
      ...empty,
      impressions: [impression('i1', null, true), impression('i2', 'i1', false)],
    });
    const events = reply.events.filter((e) => e.kind === 'impression');
    expect(events.map((e) => [e.key, e.at, e.title, e.amended])).toEqual([
      ['impression:i1:recorded', '2026-11-20T00:00:00.000Z', 'Impression recorded: digital (intraoral scan)', true],
      ['impression:i2:recorded', '2026-11-20T00:00:00.000Z', 'Impression amended: digital (intraoral scan)', false],
    ]);
    expect(events[0].detail).toBe('scan bodies 15: Scan body lot SB-1; 16: Scan body lot SB-2; 1 scan file');
  });
});
