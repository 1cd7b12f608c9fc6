// Planned implant sites and placements: what the surgeon (or the dentist) placed, with the UDI.
import { z } from 'zod';
import { keepingOmitted } from './amendment.js';
import { AxisComponent, Id, IsoDate, IsoDateTime, NoteText, PlainText, TextAllowing } from './common.js';
import { GS } from '@torquetrail/domain';
import type { RouteContract } from './route-contract.js';
import { ArchSite } from './patients.js';
import { CLOSURE_KINDS, Connection, LoadingProtocol } from './enums.js';

export const AddSiteBody = z.object({
  /** FDI (ISO 3950) position; checked with the domain's `isValidFdi` on the server. */
  fdi: z.number({ error: 'Choose a tooth position' }).int('Choose a tooth position'),
});
export type AddSiteBody = z.input<typeof AddSiteBody>;

export const PlacementOptionComponent = z.object({
  id: Id,
  kind: z.enum(CLOSURE_KINDS),
  name: z.string(),
  referenceCode: z.string(),
  requiresLot: z.boolean(),
});
export type PlacementOptionComponent = z.infer<typeof PlacementOptionComponent>;

export const PlacementOptionPlatform = z.object({
  id: Id,
  name: z.string(),
  diameterMm: z.number(),
  connection: Connection,
  platformShift: z.boolean(),
  components: z.array(PlacementOptionComponent),
});
export const PlacementOptionSystem = z.object({
  id: Id,
  name: z.string(),
  manufacturer: z.string(),
  platforms: z.array(PlacementOptionPlatform),
});

/** The implant systems of the SITE's practice (the surgeon of another practice may place from them). */
export const PlacementOptionsReply = z.object({
  siteId: Id,
  fdi: z.number().int(),
  caution: z.string(),
  systems: z.array(PlacementOptionSystem),
});
export type PlacementOptionsReply = z.infer<typeof PlacementOptionsReply>;

/** Empty text is no text: stored as null. */
const optional = (text: ReturnType<typeof PlainText>) =>
  text
    .nullable()
    .default(null)
    .transform((s) => (s ? s : null));

export const Axis = z
  .object({ x: AxisComponent, y: AxisComponent, z: AxisComponent })
  .refine((a) => Math.hypot(a.x, a.y, a.z) > 1e-9, 'The axis cannot be a zero vector');

/** Accepted ranges of placement values, inclusive; the web's inputs use the same. */
export const IMPLANT_LENGTH_MM_RANGE = Object.freeze({ min: 4, max: 20 } as const);
export const INSERTION_TORQUE_NCM_RANGE = Object.freeze({ min: 5, max: 100 } as const);
export const ISQ_RANGE = Object.freeze({ min: 1, max: 99 } as const);
const between = (what: string, { min, max }: { min: number; max: number }, unit = '') =>
  `${what} must be between ${min} and ${max}${unit}`;

const placementFields = {
  platformId: z.uuid({ error: 'Choose the platform' }),
  placedOn: IsoDate,
  lengthMm: z
    .number({ error: 'Enter the implant length in mm' })
    .min(IMPLANT_LENGTH_MM_RANGE.min, between('Length', IMPLANT_LENGTH_MM_RANGE, ' mm'))
    .max(IMPLANT_LENGTH_MM_RANGE.max, between('Length', IMPLANT_LENGTH_MM_RANGE, ' mm')),
  lot: optional(PlainText(40)),
  /** The UDI as scanned (raw, with GS separators) or typed (human-readable); parsed on the server. */
  udi: TextAllowing([GS, '\r', '\n'], 200)
    .nullable()
    .default(null)
    .transform((s) => (s && s.trim() ? s : null)),
  insertionTorqueNcm: z
    .number()
    .min(INSERTION_TORQUE_NCM_RANGE.min, between('Insertion torque', INSERTION_TORQUE_NCM_RANGE, ' N·cm'))
    .max(INSERTION_TORQUE_NCM_RANGE.max, between('Insertion torque', INSERTION_TORQUE_NCM_RANGE, ' N·cm'))
    .nullable()
    .default(null),
  stabilityIsq: z
    .number()
    .int('ISQ is a whole number')
    .min(ISQ_RANGE.min, between('ISQ', ISQ_RANGE))
    .max(ISQ_RANGE.max, between('ISQ', ISQ_RANGE))
    .nullable()
    .default(null),
  grafting: optional(NoteText(500)),
  loadingProtocol: LoadingProtocol.nullable().default(null),
  axis: Axis.nullable().default(null),
  notes: optional(NoteText(2000)),
};

export const PlacementBody = z.object({
  ...placementFields,
  /** A healing abutment or cover screw of the chosen platform, installed at surgery (hand-tight). */
  closureComponentId: Id.nullable().default(null),
  closureLot: optional(PlainText(40)),
});
export type PlacementBody = z.input<typeof PlacementBody>;

/** A new version: a field left out keeps its value, `null` clears it. */
export const PlacementAmendmentBody = z.object({
  ...keepingOmitted(placementFields),
  amendmentReason: NoteText(500).min(3, 'Say why the entry is amended'),
});
export type PlacementAmendmentBody = z.input<typeof PlacementAmendmentBody>;

export const PlacementRecord = z.object({
  id: Id,
  siteId: Id,
  platformId: Id,
  platformName: z.string(),
  systemName: z.string(),
  placedOn: IsoDate,
  surgeonName: z.string(),
  lengthMm: z.number(),
  lot: z.string().nullable(),
  udi: z.string().nullable(),
  insertionTorqueNcm: z.number().nullable(),
  stabilityIsq: z.number().nullable(),
  grafting: z.string().nullable(),
  loadingProtocol: LoadingProtocol.nullable(),
  axis: z.object({ x: z.number(), y: z.number(), z: z.number() }).nullable(),
  notes: z.string().nullable(),
  supersedesId: Id.nullable(),
  amendmentReason: z.string().nullable(),
  recordedAt: IsoDateTime,
  /** The healing abutment or cover screw installed with the placement, if any. */
  closureInstanceId: Id.nullable(),
});
export type PlacementRecord = z.infer<typeof PlacementRecord>;

/** Readable explanation of a UDI parse error code (the domain's `UdiError.code`), for API and web. */
const UDI_ERROR_HINTS: Record<string, string> = {
  empty: 'The UDI is empty',
  'bad-check-digit': 'The GTIN check digit is wrong: rescan or retype the UDI',
  'bad-date': 'A date in the UDI does not exist',
  'unknown-ai': 'The UDI contains an element that is not supported',
  truncated: 'The UDI is incomplete',
  'missing-gtin': 'The UDI has no (01) GTIN',
  'too-long': 'An element of the UDI is too long',
  'bad-format': 'The UDI is not a GS1 element string',
  'bad-character': 'The UDI contains a character GS1 does not allow',
  'duplicate-ai': 'An element appears twice in the UDI',
};
export function describeUdiError(code: string, detail: string): string {
  return `${UDI_ERROR_HINTS[code] ?? 'The UDI cannot be read'} (${detail})`;
}

const r = (
  method: RouteContract['method'],
  path: string,
  summary: string,
  extra: Partial<RouteContract> = {},
): RouteContract => ({ method, path, summary, signedIn: true, ...extra });

export const placementRoutes: RouteContract[] = [
  r('post', '/patients/:id/sites', 'Add a planned implant site at an FDI position (dentist)', {
    body: AddSiteBody,
    reply: ArchSite,
  }),
  r(
    'get',
    '/sites/:id/placement-options',
    "Implant systems, platforms and closure parts of the site's practice, for recording a placement",
    { reply: PlacementOptionsReply },
  ),
  r('post', '/sites/:id/placements', 'Record the placement of a planned site; a UDI is parsed on the server', {
    body: PlacementBody,
    reply: PlacementRecord,
  }),
  r('post', '/placements/:id/amendments', 'Amend a placement: a new version superseding the old one, with its reason', {
    body: PlacementAmendmentBody,
    reply: PlacementRecord,
  }),
];
