// Component catalogue and torque wrenches: the practice admin edits, everyone in the practice reads.
import { z } from 'zod';
import { TORQUE_NCM_RANGE } from '@torquetrail/domain';
import { Id, IsoDate, PlainText } from './common.js';
import { ComponentKind, Connection, Tray, WrenchType } from './enums.js';

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
  tray: Tray.nullable(),
  /** null = hand-tight. */
  torqueSpecNcm: z.number().nullable(),
  tolerancePct: z.number(),
  requiresLot: z.boolean(),
  /** Recorded in a patient (a component instance exists): it can be corrected but never deleted. */
  inUse: z.boolean(),
});
export type CatalogueComponent = z.infer<typeof CatalogueComponent>;

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

export const CatalogueSystem = z.object({
  id: Id,
  name: z.string(),
  manufacturer: z.string(),
  platforms: z.array(CataloguePlatform),
});
export type CatalogueSystem = z.infer<typeof CatalogueSystem>;

export const CatalogueReply = z.object({ caution: z.string(), systems: z.array(CatalogueSystem) });
export type CatalogueReply = z.infer<typeof CatalogueReply>;

const name = PlainText(120).min(1, 'Required');
/** Accepted ranges of catalogue values, inclusive; the web's inputs use the same. */
export const PLATFORM_DIAMETER_MM_RANGE = Object.freeze({ min: 2, max: 10 } as const);
export const PART_ANGLE_DEG_RANGE = Object.freeze({ min: 0, max: 45 } as const);
export const COLLAR_HEIGHT_MM_RANGE = Object.freeze({ min: 0, max: 10 } as const);
const angleDeg = z.number().min(PART_ANGLE_DEG_RANGE.min).max(PART_ANGLE_DEG_RANGE.max);
const collarHeightMm = z.number().min(COLLAR_HEIGHT_MM_RANGE.min).max(COLLAR_HEIGHT_MM_RANGE.max);
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
export const SystemPatch = SystemBody.partial();
export type SystemPatch = z.infer<typeof SystemPatch>;

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
  tray: Tray.nullable().default(null),
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
  tray: Tray.nullable().optional(),
  torqueSpecNcm: torqueSpecNcm.nullable().optional(),
  tolerancePct: tolerancePct.optional(),
  requiresLot: z.boolean().optional(),
});
export type ComponentPatch = z.infer<typeof ComponentPatch>;

export const Wrench = z.object({ id: Id, label: z.string(), type: WrenchType, lastCalibratedOn: IsoDate.nullable() });
export type Wrench = z.infer<typeof Wrench>;
export const WrenchListReply = z.object({ items: z.array(Wrench) });
export type WrenchListReply = z.infer<typeof WrenchListReply>;
export const WrenchBody = z.object({
  label: name,
  type: WrenchType,
  lastCalibratedOn: IsoDate.nullable().default(null),
});
export type WrenchBody = z.input<typeof WrenchBody>;
export const WrenchPatch = z.object({
  label: name.optional(),
  type: WrenchType.optional(),
  lastCalibratedOn: IsoDate.nullable().optional(),
});
export type WrenchPatch = z.infer<typeof WrenchPatch>;
