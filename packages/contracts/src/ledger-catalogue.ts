// Component catalogue and torque wrenches: the practice admin edits, everyone in the practice reads.
import { z } from 'zod';
import { CALIBRATION_INTERVAL_RANGE, isValidGtin, PART_ANGLE_RANGE_DEG, TORQUE_NCM_RANGE } from '@torquetrail/domain';
import { Id, IsoDate, IsoDateTime, NoteText, PlainText } from './common.js';
import {
  ABUTMENT_KINDS,
  type ComponentKind as ComponentKindValue,
  ComponentKind,
  Connection,
  CopingLevel,
  DENTURE_RETAINER_KINDS,
  Tray,
  WrenchType,
} from './enums.js';

/** Shown on the catalogue and every torque form. */
export const MANUFACTURER_CAUTION =
  "Torque values and compatibility are manufacturer-specific: the manufacturer's instructions, the clinician's judgement and local regulations rule.";

export const CatalogueComponent = z.object({
  id: Id,
  platformId: Id,
  kind: ComponentKind,
  name: z.string(),
  referenceCode: z.string(),
  engaging: z.boolean().nullable(),
  angleDeg: z.number().nullable(),
  collarHeightMm: z.number().nullable(),
  /** Attachments: the divergence between two implants the manufacturer states it tolerates, degrees (shown with the caution). */
  maxDivergenceDeg: z.number().nullable(),
  /** Retentive inserts and clips: the strength as the manufacturer labels it, e.g. "light". */
  retentionLabel: z.string().nullable(),
  /** Retentive inserts and clips: the retention force in newtons, when the catalogue states one. */
  retentionN: z.number().nullable(),
  tray: Tray.nullable(),
  /** Impression copings and scan bodies: on the implant or on a multi-unit abutment (shown with the caution). */
  copingLevel: CopingLevel.nullable(),
  /** null = hand-tight. */
  torqueSpecNcm: z.number().nullable(),
  tolerancePct: z.number(),
  requiresLot: z.boolean(),
  /** Recorded in a patient (an instance of any version exists): it can be corrected but never deleted. */
  inUse: z.boolean(),
  /** Versions (ADR 0006): an edit saves a new version; records keep the version they used. 1 = first. */
  version: z.number().int(),
  /** When this version was saved. */
  versionedAt: IsoDateTime,
});
export type CatalogueComponent = z.infer<typeof CatalogueComponent>;

/** Every version of one part, oldest first. */
export const ComponentVersionsReply = z.object({
  items: z.array(
    CatalogueComponent.omit({ inUse: true }).extend({
      /** Who saved this version (null for versions saved by the seed or before versions were kept). */
      byName: z.string().nullable(),
      current: z.boolean(),
    }),
  ),
});
export type ComponentVersionsReply = z.infer<typeof ComponentVersionsReply>;

export const CataloguePlatform = z.object({
  id: Id,
  systemId: Id,
  name: z.string(),
  diameterMm: z.number(),
  connection: Connection,
  platformShift: z.boolean(),
  components: z.array(CatalogueComponent),
});
export type CataloguePlatform = z.infer<typeof CataloguePlatform>;

/** A GS1 product number (GTIN-8, -12, -13 or -14, check digit verified), kept as GTIN-14. */
export const Gtin = z
  .string({ error: 'Enter the GTIN' })
  .trim()
  .refine(isValidGtin, { error: 'Enter a GTIN of 8, 12, 13 or 14 digits whose last digit checks (see the label)' })
  .transform((g) => g.padStart(14, '0'));

/**
 * A GTIN the practice's catalogue gives this system: `entered` by whoever keeps the catalogue, or
 * learned from the first placement whose UDI carried it. A placement whose UDI's GTIN the
 * catalogue gives another system is flagged in its Site file.
 */
export const SystemGtin = z.object({ gtin: z.string(), entered: z.boolean() });

export const CatalogueSystem = z.object({
  id: Id,
  name: z.string(),
  manufacturer: z.string(),
  gtins: z.array(SystemGtin),
  platforms: z.array(CataloguePlatform),
});
export type CatalogueSystem = z.infer<typeof CatalogueSystem>;

export const CatalogueReply = z.object({ caution: z.string(), systems: z.array(CatalogueSystem) });
export type CatalogueReply = z.infer<typeof CatalogueReply>;

const name = PlainText(120).min(1, 'Required');
/** Accepted ranges of catalogue values, inclusive; the web's inputs use the same. */
export const PLATFORM_DIAMETER_MM_RANGE = Object.freeze({ min: 2, max: 10 } as const);
/** The domain's range: the plan's rules accept every angle the catalogue accepts. */
export const PART_ANGLE_DEG_RANGE = PART_ANGLE_RANGE_DEG;
export const COLLAR_HEIGHT_MM_RANGE = Object.freeze({ min: 0, max: 10 } as const);
const angleDeg = z
  .number({ error: 'Enter the angle in degrees, e.g. 17' })
  .min(PART_ANGLE_DEG_RANGE.min, {
    error: `From ${PART_ANGLE_DEG_RANGE.min}° (straight) to ${PART_ANGLE_DEG_RANGE.max}°`,
  })
  .max(PART_ANGLE_DEG_RANGE.max, {
    error: `From ${PART_ANGLE_DEG_RANGE.min}° (straight) to ${PART_ANGLE_DEG_RANGE.max}°`,
  });
const collarHeightMm = z
  .number({ error: 'Enter the collar height in millimetres, e.g. 2.5' })
  .min(COLLAR_HEIGHT_MM_RANGE.min, { error: `From ${COLLAR_HEIGHT_MM_RANGE.min} to ${COLLAR_HEIGHT_MM_RANGE.max} mm` })
  .max(COLLAR_HEIGHT_MM_RANGE.max, { error: `From ${COLLAR_HEIGHT_MM_RANGE.min} to ${COLLAR_HEIGHT_MM_RANGE.max} mm` });
/** An attachment's stated divergence tolerance between two implants, degrees, inclusive. */
export const MAX_DIVERGENCE_DEG_RANGE = Object.freeze({ min: 0, max: 90 } as const);
const maxDivergenceDeg = z
  .number({ error: 'Enter the tolerance in degrees, e.g. 20' })
  .min(MAX_DIVERGENCE_DEG_RANGE.min, 'Cannot be negative')
  .max(MAX_DIVERGENCE_DEG_RANGE.max, `At most ${MAX_DIVERGENCE_DEG_RANGE.max}°`);
/** A retentive insert's stated force, N, inclusive. */
export const RETENTION_N_RANGE = Object.freeze({ min: 0, max: 100 } as const);
const retentionN = z
  .number({ error: 'Enter the force in newtons, e.g. 12' })
  .min(RETENTION_N_RANGE.min, 'Cannot be negative')
  .max(RETENTION_N_RANGE.max, `At most ${RETENTION_N_RANGE.max} N`);
const retentionLabel = PlainText(40);

/**
 * Which of the values the rules and the lab read belong to which kind of part: the add and edit
 * forms offer these inputs only, and the API refuses one given for another kind (beside the field).
 */
export const PART_VALUES_BY_KIND = Object.freeze({
  engaging: [...ABUTMENT_KINDS, 'multi-unit-abutment', 'impression-coping', 'scan-body', 'attachment-abutment'],
  angleDeg: [...ABUTMENT_KINDS, 'multi-unit-abutment', 'attachment-abutment'],
  collarHeightMm: [...ABUTMENT_KINDS, 'multi-unit-abutment', 'attachment-abutment'],
  maxDivergenceDeg: ['attachment-abutment'],
  retentionLabel: DENTURE_RETAINER_KINDS,
  retentionN: DENTURE_RETAINER_KINDS,
  copingLevel: ['impression-coping', 'scan-body'],
  tray: ['impression-coping'],
} as const satisfies Record<string, readonly ComponentKindValue[]>);
export type KindValue = keyof typeof PART_VALUES_BY_KIND;

/** Plain words for a value given on a kind of part that does not state it. */
const NOT_FOR_KIND: Record<Exclude<KindValue, 'engaging' | 'angleDeg' | 'collarHeightMm' | 'tray'>, string> = {
  maxDivergenceDeg: 'Only an attachment abutment states a divergence tolerance: leave it empty for this kind',
  retentionLabel: 'Only a retentive insert or a bar clip has a retention strength: leave it empty for this kind',
  retentionN: 'Only a retentive insert or a bar clip has a retention force: leave it empty for this kind',
  copingLevel: 'Only an impression coping or a scan body has a coping level: leave it empty for this kind',
};

/** True when a part of this kind states this value (the form shows its input). */
export function kindStates(kind: ComponentKindValue, value: KindValue): boolean {
  return (PART_VALUES_BY_KIND[value] as readonly ComponentKindValue[]).includes(kind);
}

/**
 * The values the rules read that were given for a kind of part that does not state them, as
 * field → message. Engaging, angle, collar and tray are left as they are: the catalogues entered
 * before the forms offered inputs by kind hold such values, and no rule reads them on other kinds.
 */
export function valuesNotForKind(
  kind: ComponentKindValue,
  values: Partial<Record<KindValue, unknown>>,
): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [field, message] of Object.entries(NOT_FOR_KIND) as [keyof typeof NOT_FOR_KIND, string][])
    if (values[field] !== null && values[field] !== undefined && !kindStates(kind, field)) out[field] = message;
  return out;
}
/** A part's torque tolerance in the catalogue, %, inclusive (the domain's verdict accepts up to 100). */
export const TOLERANCE_PCT_RANGE = Object.freeze({ min: 0, max: 50 } as const);
const tolerancePct = z.number().min(TOLERANCE_PCT_RANGE.min).max(TOLERANCE_PCT_RANGE.max);
/** N·cm, within the domain's accepted range. */
const torqueSpecNcm = z
  .number()
  .min(TORQUE_NCM_RANGE.min, `At least ${TORQUE_NCM_RANGE.min} N·cm`)
  .max(TORQUE_NCM_RANGE.max, `At most ${TORQUE_NCM_RANGE.max} N·cm`);

export const SystemBody = z.object({ name, manufacturer: name });
export type SystemBody = z.infer<typeof SystemBody>;
export const SystemPatch = SystemBody.partial().extend({
  /** GTINs to give this system; one the catalogue gave another system (learned or entered) moves here. */
  gtins: z.array(Gtin).max(50, { error: 'At most 50 GTINs at a time' }).optional(),
});
export type SystemPatch = z.input<typeof SystemPatch>;
/** The web's form for one GTIN entered on a system. */
export const SystemGtinForm = z.object({ gtin: Gtin });
export type SystemGtinForm = z.input<typeof SystemGtinForm>;

export const PlatformBody = z.object({
  systemId: Id,
  name,
  diameterMm: z
    .number()
    .min(PLATFORM_DIAMETER_MM_RANGE.min, `At least ${PLATFORM_DIAMETER_MM_RANGE.min} mm`)
    .max(PLATFORM_DIAMETER_MM_RANGE.max, `At most ${PLATFORM_DIAMETER_MM_RANGE.max} mm`),
  connection: Connection,
  platformShift: z.boolean(),
});
export type PlatformBody = z.infer<typeof PlatformBody>;
export const PlatformPatch = PlatformBody.omit({ systemId: true }).partial();
export type PlatformPatch = z.infer<typeof PlatformPatch>;

export const ComponentBody = z.object({
  platformId: Id,
  kind: ComponentKind,
  name,
  referenceCode: PlainText(60).min(1, 'Required'),
  engaging: z.boolean().nullable().default(null),
  angleDeg: angleDeg.nullable().default(null),
  collarHeightMm: collarHeightMm.nullable().default(null),
  maxDivergenceDeg: maxDivergenceDeg.nullable().default(null),
  retentionLabel: retentionLabel.nullable().default(null),
  retentionN: retentionN.nullable().default(null),
  tray: Tray.nullable().default(null),
  copingLevel: CopingLevel.nullable().default(null),
  /** N·cm; null = hand-tight. */
  torqueSpecNcm: torqueSpecNcm.nullable().default(null),
  tolerancePct: tolerancePct.default(10),
  requiresLot: z.boolean().default(true),
});
export type ComponentBody = z.input<typeof ComponentBody>;
/** The platform and kind of a part stay fixed once created (records point at it). */
export const ComponentPatch = z.object({
  name: name.optional(),
  referenceCode: PlainText(60).min(1, 'Required').optional(),
  engaging: z.boolean().nullable().optional(),
  angleDeg: angleDeg.nullable().optional(),
  collarHeightMm: collarHeightMm.nullable().optional(),
  maxDivergenceDeg: maxDivergenceDeg.nullable().optional(),
  retentionLabel: retentionLabel.nullable().optional(),
  retentionN: retentionN.nullable().optional(),
  tray: Tray.nullable().optional(),
  copingLevel: CopingLevel.nullable().optional(),
  torqueSpecNcm: torqueSpecNcm.nullable().optional(),
  tolerancePct: tolerancePct.optional(),
  requiresLot: z.boolean().optional(),
});
export type ComponentPatch = z.infer<typeof ComponentPatch>;

export const Wrench = z.object({
  id: Id,
  label: z.string(),
  type: WrenchType,
  /** The latest calibration in the wrench's history, if any. */
  lastCalibratedOn: IsoDate.nullable(),
  /** When the latest calibration runs out (the practice's interval); null without a calibration. */
  calibrationDueOn: IsoDate.nullable(),
  /** Overdue today, or never calibrated (calibrationOverdue in @torquetrail/domain). */
  calibrationOverdue: z.boolean(),
  /** Versions (ADR 0006): editing the label or type saves a new version. 1 = first. */
  version: z.number().int(),
});
export type Wrench = z.infer<typeof Wrench>;
export const WrenchListReply = z.object({
  items: z.array(Wrench),
  /** The practice's calibration interval, months. */
  calibrationIntervalMonths: z.number().int(),
});
const intervalMessage = `A whole number of months from ${CALIBRATION_INTERVAL_RANGE.min} to ${CALIBRATION_INTERVAL_RANGE.max}`;
/** The practice's wrench calibration interval (default 12 months [common practice]). */
export const WrenchSettings = z.object({
  calibrationIntervalMonths: z
    .number({ error: 'Enter a number of months' })
    .int({ error: intervalMessage })
    .min(CALIBRATION_INTERVAL_RANGE.min, { error: intervalMessage })
    .max(CALIBRATION_INTERVAL_RANGE.max, { error: intervalMessage }),
});
export type WrenchSettings = z.infer<typeof WrenchSettings>;
export type WrenchListReply = z.infer<typeof WrenchListReply>;
export const WrenchBody = z.object({
  label: name,
  type: WrenchType,
  /** The wrench's last calibration when it joins the catalogue: the first entry of its history. */
  lastCalibratedOn: IsoDate.nullable().default(null),
});
export type WrenchBody = z.input<typeof WrenchBody>;
/** Label and type; calibrations are added to the history (CalibrationBody), never overwritten. */
export const WrenchPatch = z.object({
  label: name.optional(),
  type: WrenchType.optional(),
});
export type WrenchPatch = z.infer<typeof WrenchPatch>;

/** One calibration of a wrench. The date cannot be in the future (checked against the server's day). */
export const CalibrationBody = z.object({
  calibratedOn: IsoDate,
  note: NoteText(500).nullable().default(null),
});
export type CalibrationBody = z.input<typeof CalibrationBody>;
export const Calibration = z.object({
  id: Id,
  calibratedOn: IsoDate,
  note: z.string().nullable(),
  byName: z.string().nullable(),
  recordedAt: IsoDateTime,
});
export type Calibration = z.infer<typeof Calibration>;
/** A wrench's calibrations, newest first. */
export const CalibrationListReply = z.object({ items: z.array(Calibration) });
export type CalibrationListReply = z.infer<typeof CalibrationListReply>;
