// What a share lets a surgeon of another practice READ, field by field (issue 12): name, date of
// birth, the shared sites and what the scope names. Never contact details, risk factors, notes
// written by other roles, staff names beyond the signing clinician (the placement's surgeon), the
// lab's name and address, or the patient's other sites. Lists name the keys a reply may carry, at
// any depth of the reply (nested objects are judged by the same list, so a key not named here is
// left out wherever it appears: closed by default). A key ending in `.*` keeps its value whole (a
// record whose keys are data, not fields).

/** The keys of a list reply around its rows. */
const ENVELOPE = ['items', 'total', 'page', 'pageSize', 'today'] as const;

/** Who the patient is, and the shared sites on the Arch. */
export const SHARED_PATIENT_FIELDS = [
  'id',
  'practiceId',
  'chartNumber',
  'givenName',
  'familyName',
  'birthDate',
  'practiceName',
  'implantSiteCount',
  'archivedAt',
  'shareScopes',
  'sites',
  // ArchSite
  'fdi',
  'status',
  'maintenanceStatus',
  'lastExamDate',
  'systemName',
  'partsMissingSeatingTorque',
] as const;

/** The placement: what was placed, when, and by whom (the signing clinician). */
const PLACEMENT = [
  'placedOn',
  'surgeonName',
  'systemName',
  'manufacturer',
  'platformName',
  'diameterMm',
  'lengthMm',
  'connection',
  'platformShift',
  'lot',
  // What the surgeon read from the implant's label and recorded at placement (issue 15 §5); the
  // placement's free-text notes stay out (they may be another role's).
  'udi',
  'gtin',
  'serial',
  'expiry',
  'gtinOtherSystem',
  'grafting',
  'insertionTorqueNcm',
  'stabilityIsq',
  'loadingProtocol',
] as const;

/** A torque entry: values and verdicts, never who applied it. */
const TORQUE = [
  'id',
  'appliedNcm',
  'specNcm',
  'tolerancePct',
  'verdict',
  'reason',
  'performedAt',
  'wrenchCalibrationOverdue',
  'earlySettlingConfirmed',
] as const;

/** A part of the Stack (component instance) and its catalogue specification. */
const PART = [
  'instanceId',
  'kind',
  'name',
  'referenceCode',
  'engaging',
  'angleDeg',
  'collarHeightMm',
  'torqueSpecNcm',
  'tolerancePct',
  'lot',
  'installedOn',
  'removedOn',
  'lastTorque',
  'seatingTorqueMissing',
  'componentId',
  'requiresLot',
  'retorqueDueAt',
  'newerVersion',
  'versionedAt',
  'platformId',
] as const;

/** The radiographic check of a delivery's seating, without its note or who recorded it. */
const SEATING = [
  'checkId',
  'seated',
  'radiographId',
  'radiographTakenOn',
  'radiographEnteredInError',
  'recordedAt',
  'restorationId',
  'event',
  'supersedesId',
  'current',
] as const;

/** A restoration: the design and its parts, never the lab, the plan's notes or who planned it. */
const RESTORATION = [
  'id',
  'patientId',
  'kind',
  'retention',
  'material',
  'shade',
  'status',
  'copingsSplinted',
  'impressionTakenOn',
  'deliveredOn',
  'dueOn',
  'findings',
  'severity',
  'code',
  'message',
  'source',
  'rulesVersion',
  'createdAt',
  'supersedesId',
  'supersededById',
  'retrievable',
  // Provisional and its replacement, cantilevers and the A-P spread: the design a surgeon shares.
  'provisional',
  'plannedReplacementOn',
  'replacedById',
  'cantileverLeftMm',
  'cantileverRightMm',
  'apSpreadMm',
  'interface',
  'spansFdi',
  'seating',
  'sites',
  'siteId',
  'fdi',
  'universal',
  'impressionCoping',
  'multiUnitAngleDeg',
  'restorativeSpaceMm',
  'axis',
  'systemName',
  'platformName',
  'connection',
  'components',
  'tray',
  ...PART,
  ...SEATING,
] as const;

/** Timeline entries: what happened when, never the free text or who wrote it. */
const TIMELINE_ENTRY = [
  'siteId',
  'events',
  'key',
  'id',
  'kind',
  'at',
  'dateOnly',
  'title',
  'amended',
  'supersedesId',
  'componentInstanceId',
  'verdict',
  'code',
  'appliedNcm',
  'radiographId',
  'torqueSeries',
  'label',
  'specNcm',
  'tolerancePct',
  'removedOn',
  'points',
  'reason',
] as const;

/**
 * Timeline kinds whose `detail` is computed from the record (a specification, a bone level, a part
 * reference), never a note someone wrote or an e-mail address. Not the placement: its detail line
 * carries the placement's notes; a share reads the placement's fields in the Site file instead.
 */
export const TIMELINE_COMPUTED_DETAIL_KINDS = [
  'plan',
  'delivery',
  'part',
  'torque',
  'recall-exam',
  'bone-level',
] as const;

/** A site the planner could restore. */
const RESTORABLE_SITE = [
  'siteId',
  'fdi',
  'universal',
  'status',
  'platformId',
  'systemName',
  'platformName',
  'connection',
  'diameterMm',
  'axis',
] as const;

/** The Site file, its Timeline and the restorable sites: every reply of the ImplantSite routes. */
const IMPLANT_SITE = [
  'id',
  'patientId',
  'patientName',
  'fdi',
  'status',
  'maintenanceStatus',
  'placement',
  'parts',
  'restoration',
  ...PLACEMENT,
  ...PART,
  ...TORQUE,
  ...RESTORATION,
  ...TIMELINE_ENTRY,
  ...RESTORABLE_SITE,
] as const;

/** A measurement on a radiograph and the bone levels read from it, without who measured. */
const MEASUREMENT = [
  'id',
  'radiographId',
  'siteId',
  'points',
  'platform',
  'apex',
  'mesial',
  'distal',
  'row',
  'col',
  'implantTrueMm',
  'mmPerUnit',
  'mesialMm',
  'distalMm',
  'spacingEstimate',
  'implantLengthMm',
  'disagreement',
  'flagged',
  'rulesVersion',
  'measuredAt',
  'supersedesId',
  'measurementId',
  'takenOn',
  'examBoneLevelMm',
  'amended',
] as const;

/** Radiographs and bone levels: the image's facts, never its note, file name or who filed it. */
const RADIOGRAPH = [
  'id',
  'patientId',
  'fileType',
  'kind',
  'takenOn',
  'sizeBytes',
  'sha256',
  'previewProblem',
  'rows',
  'columns',
  'pixelSpacing',
  'imagerPixelSpacing',
  'magnificationFactor',
  'studyDate',
  'modality',
  'bitsStored',
  'photometricInterpretation',
  'transferSyntaxUid',
  'previewStatus',
  'previewAttempts',
  'siteIds',
  'uploadedAt',
  'enteredInError',
  'at',
  'measurements',
  'siteImplants',
  'loadedOn',
  'albrektsson',
  'meets',
  'firstYearLossMm',
  'annualLossAfterFirstYearMm',
  'reasons',
  'allowance',
  'date',
  'maxBoneLevelMm',
  'icoi',
  'grade',
  'boneLossMm',
  ...MEASUREMENT,
] as const;

/** A recall exam's findings and verdict, never its notes or examiner. */
const EXAM = [
  'id',
  'patientId',
  'siteId',
  'fdi',
  'visitId',
  'examinedOn',
  'sites',
  'position',
  'probingDepthMm',
  'bleeding',
  'suppuration',
  'mobility',
  'plaqueIndex',
  'bleedingIndex',
  'keratinizedMucosaMm',
  'residualCement',
  'boneLevelMm',
  'boneLevelMeasurementId',
  'isBaseline',
  'status',
  'reasons',
  'flags',
  'rulesVersion',
  'ruleOptions.*',
  'baselineExamId',
  'supersedesId',
  'recordedAt',
] as const;

/** The Recall desk, the exam context and a site's exam history, without risk factors or policy. */
const RECALL_EXAM = [
  ...EXAM,
  'exams',
  // The Recall desk's row and its sites.
  'chartNumber',
  'name',
  'nextDueOn',
  'overdueDays',
  'lastExamOn',
  // The exam context (the patient, each site's baseline, previous exam and measured bone levels).
  'patient',
  'examinable',
  'deliveredOn',
  'baseline',
  'previous',
  'measuredBoneLevels',
  'measurementId',
  'radiographId',
  'mesialMm',
  'distalMm',
  'takenOn',
  'measuredAt',
] as const;

/** How the shared implants do: the outcome table's row of a shared site. */
const OUTCOME_IMPLANT = [
  'siteId',
  'patientId',
  'chartNumber',
  'fdi',
  'placedOn',
  'system',
  'retention',
  'outcome',
  'endedOn',
  'followUpYears',
  'periImplantStatus',
  'periImplantOn',
  'boneChangeMm',
  'boneChangeSince',
  'complications',
] as const;

/** The referral summary's state: whom it goes to (the surgeons of the shares) and its mails. */
const REFERRAL_SUMMARY = [
  'recipients',
  'shareId',
  'surgeonName',
  'practiceName',
  'mails',
  'id',
  'status',
  'attempts',
  'requestedAt',
  'sentAt',
] as const;

/** The keys a share opens, per subject of a read route (see the comment at the top). */
export const SHARED_READ_FIELDS = {
  Patient: SHARED_PATIENT_FIELDS,
  ImplantSite: [...ENVELOPE, ...IMPLANT_SITE],
  Placement: [...ENVELOPE, ...PLACEMENT],
  Restoration: [...ENVELOPE, ...RESTORATION],
  ComponentInstance: [...ENVELOPE, ...PART],
  TorqueEvent: [...ENVELOPE, ...TORQUE],
  Complication: [...ENVELOPE, 'id', 'siteId', 'kind', 'code', 'at'],
  Radiograph: [...ENVELOPE, ...RADIOGRAPH],
  RecallExam: [...ENVELOPE, ...RECALL_EXAM],
  Outcomes: [...ENVELOPE, ...OUTCOME_IMPLANT],
  ReferralSummary: [...ENVELOPE, ...REFERRAL_SUMMARY],
} as const;
export type SharedSubject = keyof typeof SHARED_READ_FIELDS;

/** Fields of a timeline entry a share opens only for some kinds of entry (CASL conditions on `kind`). */
export const SHARED_DETAIL_FIELDS = ['detail'] as const;
/** The signing clinician's name: on the placement's own Timeline entry only. */
export const SHARED_SIGNER_FIELDS = ['byName'] as const;
