// Radiographs: upload (binary body), previews, entered-in-error, bone-level measurements.
import { z } from 'zod';
import { ICOI_GRADES } from '@torquetrail/domain';
import { Id, IsoDate, IsoDateTime, NoteText } from './common.js';
import { RadiographFileType, RadiographKind, RadiographPreviewStatus } from './enums.js';
import type { RouteContract } from './route-contract.js';

/** Optional user text of the query string, with the contracts' refusal of control characters. */
const optionalText = (max: number) =>
  NoteText(max)
    .optional()
    .transform((s) => (s ? s : null));

/**
 * The upload's details travel in the query string: the body is the file's bytes
 * (application/octet-stream), streamed to object storage without being held in memory.
 */
export const RadiographUploadQuery = z.object({
  kind: RadiographKind.default('other'),
  /** Date taken; when absent, the DICOM Study/Acquisition Date is used. */
  takenOn: IsoDate.optional(),
  /** Comma-separated implant site ids of the same patient. */
  siteIds: z
    .string()
    .optional()
    .transform((s) => (s ? s.split(',').filter(Boolean) : []))
    .pipe(z.array(Id, { error: 'Every site id must be a UUID' }).max(32)),
  note: optionalText(2000),
  /** The client's file name, kept as data only (never used for the object key or the type). */
  fileName: optionalText(255),
});
export type RadiographUploadQuery = z.input<typeof RadiographUploadQuery>;

export const RadiographListQuery = z.object({
  includeEnteredInError: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
});

const Spacing = z.tuple([z.number(), z.number()]).nullable();

export const Radiograph = z.object({
  id: Id,
  patientId: Id,
  fileType: RadiographFileType,
  kind: RadiographKind,
  takenOn: IsoDate.nullable(),
  /** Left out of a share's reply (notes, file names and staff names stay with the practice). */
  note: z.string().nullable().optional(),
  originalName: z.string().nullable().optional(),
  sizeBytes: z.number().int(),
  sha256: z.string(),
  rows: z.number().int().nullable(),
  columns: z.number().int().nullable(),
  pixelSpacing: Spacing,
  imagerPixelSpacing: Spacing,
  magnificationFactor: z.number().nullable(),
  studyDate: IsoDate.nullable(),
  modality: z.string().nullable(),
  bitsStored: z.number().int().nullable(),
  photometricInterpretation: z.string().nullable(),
  transferSyntaxUid: z.string().nullable(),
  /** The preview is made by a background job after the upload: pending until it is ready or unavailable. */
  previewStatus: RadiographPreviewStatus,
  /** Why there is no preview (status unavailable: e.g. an unsupported transfer syntax), else null. */
  previewProblem: z.string().nullable(),
  /** Failed attempts so far; while pending and above 0 the job is retrying. */
  previewAttempts: z.number().int(),
  siteIds: z.array(Id),
  uploadedBy: z.string().optional(),
  uploadedAt: IsoDateTime,
  enteredInError: z.object({ at: IsoDateTime, reason: z.string().optional() }).nullable(),
});
export type Radiograph = z.infer<typeof Radiograph>;

export const RadiographListReply = z.object({ items: z.array(Radiograph) });
export type RadiographListReply = z.infer<typeof RadiographListReply>;

export const EnteredInErrorBody = z.object({
  reason: NoteText(500).min(3, 'Say why (at least 3 characters)'),
});
export type EnteredInErrorBody = z.input<typeof EnteredInErrorBody>;

const Coordinate = z.number().min(-100_000).max(100_000);
export const ImagePoint = z.object({ row: Coordinate, col: Coordinate });

/** Platform shoulder (two points), apex, first bone contact mesial and distal; image pixels. */
export const MeasurementPoints = z.object({
  platform: z.tuple([ImagePoint, ImagePoint]),
  apex: ImagePoint,
  mesial: ImagePoint,
  distal: ImagePoint,
});

export const MeasurementBody = z.object({
  siteId: Id,
  points: MeasurementPoints,
  /** The implant's true length; needed only when the site's placement has none. */
  implantTrueMm: z.number().min(4, 'Implants are 4–25 mm long').max(25, 'Implants are 4–25 mm long').optional(),
});
export type MeasurementBody = z.input<typeof MeasurementBody>;

export const MeasurementAmendmentBody = MeasurementBody.omit({ siteId: true }).extend({
  reason: NoteText(500).min(3, 'Say why (at least 3 characters)'),
});
export type MeasurementAmendmentBody = z.input<typeof MeasurementAmendmentBody>;

export const Measurement = z.object({
  id: Id,
  radiographId: Id,
  siteId: Id,
  points: MeasurementPoints,
  implantTrueMm: z.number(),
  mmPerUnit: z.number(),
  /** Bone level, mm along the implant axis from the platform (positive = apical). */
  mesialMm: z.number(),
  distalMm: z.number(),
  spacingEstimate: z
    .object({
      implantLengthMm: z.number(),
      mesialMm: z.number(),
      distalMm: z.number(),
      disagreement: z.number(),
      flagged: z.boolean(),
    })
    .nullable(),
  rulesVersion: z.string(),
  measuredBy: z.string().optional(),
  measuredAt: IsoDateTime,
  supersedesId: Id.nullable(),
  amendmentReason: z.string().nullable().optional(),
});
export type Measurement = z.infer<typeof Measurement>;

export const RadiographDetail = Radiograph.extend({
  measurements: z.array(Measurement),
  /** The implant length of each linked site's placement record (null: none recorded, the viewer asks). */
  siteImplants: z.array(z.object({ siteId: Id, implantLengthMm: z.number().nullable() })),
});
export type RadiographDetail = z.infer<typeof RadiographDetail>;

/** One current measurement of a site, on a radiograph not entered in error. */
export const SiteBoneLevel = z.object({
  measurementId: Id,
  radiographId: Id,
  /** Date the radiograph was taken (null: not known; such a reading is left out of the chart). */
  takenOn: IsoDate.nullable(),
  mesialMm: z.number(),
  distalMm: z.number(),
  /** The worse side, as offered to the recall exam (0.1 mm, never below 0). */
  examBoneLevelMm: z.number(),
  implantTrueMm: z.number(),
  measuredBy: z.string().optional(),
  measuredAt: IsoDateTime,
  /** This version amends an earlier one. */
  amended: z.boolean(),
});
export type SiteBoneLevel = z.infer<typeof SiteBoneLevel>;

export const IcoiGradeSchema = z.enum(ICOI_GRADES);

/** A site's measured bone levels, latest first, with the criteria of the series. Supporting information only. */
export const SiteBoneLevels = z.object({
  siteId: Id,
  /** Delivery of the site's first restoration (loading), the Albrektsson start. */
  loadedOn: IsoDate.nullable(),
  /** From the placement record, else the length the latest measurement was calibrated with. */
  implantLengthMm: z.number().nullable(),
  items: z.array(SiteBoneLevel),
  albrektsson: z
    .object({
      meets: z.boolean(),
      firstYearLossMm: z.number().nullable(),
      annualLossAfterFirstYearMm: z.number().nullable(),
      reasons: z.array(z.string()),
      allowance: z.array(z.object({ date: IsoDate, maxBoneLevelMm: z.number() })),
    })
    .nullable(),
  icoi: z.object({ grade: IcoiGradeSchema, boneLossMm: z.number(), reasons: z.array(z.string()) }).nullable(),
});
export type SiteBoneLevels = z.infer<typeof SiteBoneLevels>;

const r = (method: RouteContract['method'], path: string, summary: string, more: Partial<RouteContract> = {}) =>
  ({ method, path, summary, signedIn: true, ...more }) satisfies RouteContract;

export const radiographRoutes: RouteContract[] = [
  r(
    'post',
    '/patients/:id/radiographs',
    'Upload a radiograph (PNG, JPEG, DICOM Part 10) as application/octet-stream; type decided by its bytes',
    { query: RadiographUploadQuery, reply: Radiograph },
  ),
  r('get', '/patients/:id/radiographs', "The patient's radiographs (entered-in-error ones only on request)", {
    query: RadiographListQuery,
    reply: RadiographListReply,
  }),
  r('get', '/radiographs/:id', 'One radiograph with its current measurements', { reply: RadiographDetail }),
  r('get', '/radiographs/:id/original', 'The original file, as an attachment', {
    produces: 'application/octet-stream',
  }),
  r('get', '/radiographs/:id/preview', 'The server-made PNG preview', { produces: 'image/png' }),
  r('get', '/radiographs/:id/thumbnail', 'The server-made PNG thumbnail', { produces: 'image/png' }),
  r('post', '/radiographs/:id/entered-in-error', 'Mark a radiograph entered in error (kept, hidden from lists)', {
    status: 200,
    body: EnteredInErrorBody,
    reply: Radiograph,
  }),
  r('post', '/radiographs/:id/measurements', 'Measure bone levels of one site on the radiograph', {
    body: MeasurementBody,
    reply: Measurement,
  }),
  r('get', '/sites/:id/bone-levels', "A site's measured bone levels over time, latest first, with the criteria", {
    reply: SiteBoneLevels,
  }),
  r('post', '/radiograph-measurements/:id/amendments', 'Amend a measurement: a new version superseding it', {
    body: MeasurementAmendmentBody,
    reply: Measurement,
  }),
];
