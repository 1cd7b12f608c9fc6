// Restoration planner, delivery and lab prescriptions.
import { AP_SPREAD_MAX_MM, CANTILEVER_MAX_MM, CANTILEVER_RATIO_RANGE } from '@torquetrail/domain';
import { z } from 'zod';
import { keepingOmitted } from './amendment.js';
import { AxisComponent, FdiPosition, Id, IsoDate, IsoDateTime, NoteText, PlainText } from './common.js';
import { CatalogueComponent } from './ledger-catalogue.js';
import {
  Connection,
  FindingSeverity,
  ImpressionCopingKind,
  InterfaceKind,
  Material,
  MultiUnitAngleDeg,
  ReminderStatus,
  RestorationKind,
  RestorationStatus,
  Retention,
  SiteStatus,
} from './enums.js';

/** A plan Finding as returned by `validateRestorationPlan` (@torquetrail/domain). */
export const Finding = z.object({
  severity: FindingSeverity,
  code: z.string(),
  message: z.string(),
  fdi: z.number().optional(),
  source: z.string().optional(),
});
export type Finding = z.infer<typeof Finding>;

export const Vec3 = z.tuple([AxisComponent, AxisComponent, AxisComponent]);

export const PlanSiteBody = z.object({
  siteId: Id,
  interface: InterfaceKind,
  impressionCoping: ImpressionCopingKind,
  /** Degrees, as the catalogue states it; taken from the multi-unit abutment chosen when omitted. */
  multiUnitAngleDeg: MultiUnitAngleDeg.nullable().default(null),
  restorativeSpaceMm: z.number().min(0, 'Cannot be negative').max(40, 'At most 40 mm').nullable().default(null),
  /** Implant axis (direction vector); the placement record's axis is used when omitted. */
  axis: Vec3.nullable().default(null),
  abutmentComponentId: Id.nullable().default(null),
  multiUnitComponentId: Id.nullable().default(null),
  screwComponentIds: z.array(Id).max(4).default([]),
  impressionCopingComponentId: Id.nullable().default(null),
  /** Overdenture on stud attachments: the attachment abutment screwed into this implant. */
  attachmentComponentId: Id.nullable().default(null),
  /** Overdentures: the retentive inserts (on studs) or bar clips held in the denture over this site. */
  retainerComponentIds: z.array(Id).max(4).default([]),
});
export type PlanSiteBody = z.input<typeof PlanSiteBody>;

const optionalLine = (max: number) => PlainText(max).nullable().default(null);
const millimetres = (min: number, max: number, minMessage: string) =>
  z
    .number({ error: 'Enter a length in mm' })
    .min(min, minMessage)
    .max(max, `At most ${max} mm`)
    .nullable()
    .default(null);

export const PlanBody = z.object({
  patientId: Id,
  kind: RestorationKind,
  retention: Retention,
  material: Material,
  shade: optionalLine(20),
  copingsSplinted: z.boolean().default(false),
  labName: optionalLine(120),
  // 254: the longest address SMTP carries (RFC 5321); the address goes into the e-mail's To header.
  labEmail: z.email('Not an e-mail address').max(254).nullable().default(null),
  dueOn: IsoDate.nullable().default(null),
  notes: NoteText(2000).nullable().default(null),
  /** A provisional awaiting its definitive restoration; the planned replacement day is then required. */
  provisional: z.boolean().default(false),
  plannedReplacementOn: IsoDate.nullable().default(null),
  /** Full-arch work (CANTILEVER_KINDS): distal cantilevers (patient's left, right) and the A-P spread, mm. */
  cantileverLeftMm: millimetres(0, CANTILEVER_MAX_MM, 'Cannot be negative'),
  cantileverRightMm: millimetres(0, CANTILEVER_MAX_MM, 'Cannot be negative'),
  apSpreadMm: millimetres(0.1, AP_SPREAD_MAX_MM, 'Enter more than 0 mm'),
  sites: z.array(PlanSiteBody).min(1, 'Choose at least one site').max(16),
  /** Warning Findings the clinician has read and accepts (code and site). */
  acknowledgements: z
    .array(z.object({ code: PlainText(80), fdi: FdiPosition.nullable().default(null) }))
    .max(50)
    .default([]),
});
export type PlanBody = z.input<typeof PlanBody>;
export type PlanBodyParsed = z.output<typeof PlanBody>;

/** A new version of the plan: a field left out keeps its value, `null` clears it. */
export const PlanAmendmentBody = z.object({
  ...keepingOmitted(PlanBody.omit({ patientId: true }).shape),
  amendmentReason: NoteText(500).min(3, 'Say why the plan is amended'),
});
export type PlanAmendmentBody = z.input<typeof PlanAmendmentBody>;

/** Where the planner shows a Finding: the field path of the form (and of the 400 `fields`). */
export function findingField(finding: Pick<Finding, 'code' | 'fdi'>, siteFdis: readonly number[]): string {
  const i = finding.fdi === undefined ? -1 : siteFdis.indexOf(finding.fdi);
  const at = (field: string) => (i >= 0 ? `sites.${i}.${field}` : 'sites');
  switch (finding.code) {
    case 'non-engaging-single-crown':
    case 'engaging-interface-on-splinted':
      return at('interface');
    case 'engaging-impression-for-platform-bridge':
    case 'non-engaging-impression-for-indexed':
    case 'multi-unit-impression-required':
    case 'multi-unit-impression-without-abutment':
      return at('impressionCoping');
    case 'multi-unit-angle-without-abutment':
      return at('multiUnitAngleDeg');
    case 'catalogue-multi-unit-angle-missing':
      return at('multiUnitComponentId');
    case 'catalogue-abutment-angle-missing':
      return at('abutmentComponentId');
    case 'catalogue-coping-engaging-missing':
    case 'catalogue-coping-level-missing':
    case 'coping-level-mismatch':
      return at('impressionCopingComponentId');
    case 'abutment-non-engaging-single-unit':
    case 'abutment-interface-disagrees':
    case 'catalogue-abutment-engaging-missing':
      return at('abutmentComponentId');
    case 'splinted-engaging-copings':
      return 'copingsSplinted';
    case 'divergence-over-limit':
      return at('axis');
    case 'attachment-missing':
    case 'catalogue-value-missing':
      return at('attachmentComponentId');
    case 'insufficient-restorative-space':
      return at('restorativeSpaceMm');
    case 'cantilever-left-over-limit':
      return 'cantileverLeftMm';
    case 'cantilever-right-over-limit':
      return 'cantileverRightMm';
    case 'cantilever-spread-missing':
      return 'apSpreadMm';
    case 'invalid-position':
    case 'duplicate-site':
    case 'primary-tooth-position':
      return at('siteId');
    default:
      return 'sites';
  }
}

/** A site of the patient the planner can restore: its implant, platform and axis from the placement. */
export const RestorableSite = z.object({
  siteId: Id,
  fdi: FdiPosition,
  universal: z.string(),
  status: SiteStatus,
  platformId: Id.nullable(),
  systemName: z.string().nullable(),
  platformName: z.string().nullable(),
  connection: Connection.nullable(),
  diameterMm: z.number().nullable(),
  axis: Vec3.nullable(),
});
export type RestorableSite = z.infer<typeof RestorableSite>;
export const RestorableSitesReply = z.object({ items: z.array(RestorableSite) });
export type RestorableSitesReply = z.infer<typeof RestorableSitesReply>;

export const PlannedComponent = CatalogueComponent.omit({ inUse: true, version: true, versionedAt: true });
export type PlannedComponent = z.infer<typeof PlannedComponent>;

export const RestorationSiteDetail = z.object({
  siteId: Id,
  fdi: FdiPosition,
  universal: z.string(),
  interface: InterfaceKind,
  impressionCoping: ImpressionCopingKind,
  multiUnitAngleDeg: z.number().nullable(),
  restorativeSpaceMm: z.number().nullable(),
  axis: Vec3.nullable(),
  systemName: z.string().nullable(),
  platformName: z.string().nullable(),
  connection: Connection.nullable(),
  components: z.array(PlannedComponent),
});
export type RestorationSiteDetail = z.infer<typeof RestorationSiteDetail>;

export const LabPrescriptionSummary = z.object({
  id: Id,
  /** The prescription number printed on the sheet (the lab quotes it). */
  number: z.number().int(),
  sizeBytes: z.number().int(),
  /** The last e-mail SMTP accepted for this prescription. */
  emailedTo: z.string().nullable(),
  emailedAt: IsoDateTime.nullable(),
  /** The latest request to e-mail it: sent by the job queue, retried while SMTP is away. */
  lastEmail: z
    .object({ to: z.string(), status: ReminderStatus, attempts: z.number().int(), requestedAt: IsoDateTime })
    .nullable(),
  createdAt: IsoDateTime,
});
export type LabPrescriptionSummary = z.infer<typeof LabPrescriptionSummary>;

export const RestorationDetail = z.object({
  id: Id,
  patientId: Id,
  kind: RestorationKind,
  retention: Retention,
  material: Material,
  shade: z.string().nullable(),
  status: RestorationStatus,
  copingsSplinted: z.boolean(),
  impressionTakenOn: IsoDate.nullable(),
  deliveredOn: IsoDate.nullable(),
  /** Left out of a share's reply: the lab, the notes and who planned stay with the practice. */
  labName: z.string().nullable().optional(),
  labEmail: z.string().nullable().optional(),
  dueOn: IsoDate.nullable(),
  notes: z.string().nullable().optional(),
  findings: z.array(Finding),
  rulesVersion: z.string().nullable(),
  plannedByName: z.string().nullable().optional(),
  createdAt: IsoDateTime,
  supersedesId: Id.nullable(),
  amendmentReason: z.string().nullable().optional(),
  /** Set when a later amendment replaced this version (it stays visible, marked as amended). */
  supersededById: Id.nullable(),
  provisional: z.boolean(),
  plannedReplacementOn: IsoDate.nullable(),
  /** The restoration delivered on its sites that took this one out (a provisional's definitive). */
  replacedById: Id.nullable(),
  cantileverLeftMm: z.number().nullable(),
  cantileverRightMm: z.number().nullable(),
  apSpreadMm: z.number().nullable(),
  acknowledgements: z
    .array(z.object({ code: z.string(), fdi: z.number().nullable(), byName: z.string(), at: IsoDateTime }))
    .optional(),
  sites: z.array(RestorationSiteDetail),
  labPrescriptions: z.array(LabPrescriptionSummary).optional(),
  /** Retrievable without cutting: false for cement-retained restorations. */
  retrievable: z.boolean(),
});
export type RestorationDetail = z.infer<typeof RestorationDetail>;
export const RestorationListReply = z.object({ items: z.array(RestorationDetail) });
export type RestorationListReply = z.infer<typeof RestorationListReply>;

export const DeliveryPart = z.object({
  siteId: Id,
  componentId: Id,
  lot: PlainText(40).nullable().default(null),
});
export const DeliveryBody = z.object({
  deliveredOn: IsoDate,
  impressionTakenOn: IsoDate.nullable().default(null),
  parts: z.array(DeliveryPart).min(1, 'Record at least one part').max(64),
});
export type DeliveryBody = z.input<typeof DeliveryBody>;

/**
 * Pressing again returns (and, with emailToLab, e-mails again) the plan's latest prescription;
 * a new PDF is made only for the first one or when `revise` asks for a new version.
 */
export const LabPrescriptionBody = z.object({
  emailToLab: z.boolean().default(false),
  revise: z.boolean().default(false),
});
export type LabPrescriptionBody = z.input<typeof LabPrescriptionBody>;

const ratioMessage = `A ratio from ${CANTILEVER_RATIO_RANGE.min} to ${CANTILEVER_RATIO_RANGE.max}, in tenths (e.g. 1.5)`;
/** The practice's cantilever limit: the longest distal cantilever as a multiple of the A-P spread. */
export const CantileverSettings = z.object({
  cantileverRatioLimit: z
    .number({ error: 'Enter a ratio, e.g. 1.5' })
    .min(CANTILEVER_RATIO_RANGE.min, { error: ratioMessage })
    .max(CANTILEVER_RATIO_RANGE.max, { error: ratioMessage })
    .refine((n) => Math.abs(n * 10 - Math.round(n * 10)) < 1e-9, { error: ratioMessage }),
});
export type CantileverSettings = z.infer<typeof CantileverSettings>;
