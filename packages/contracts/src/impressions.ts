// Impressions of a restoration: analog (copings, as planned per site) or digital (an intraoral
// scan with a scan body per site and the scanner's mesh files). Amended with a reason, never
// overwritten; scan files are uploaded as application/octet-stream, their type read from the bytes.
import { z } from 'zod';
import { Id, IsoDate, IsoDateTime, NoteText, PlainText } from './common.js';
import { keepingOmitted } from './amendment.js';
import { Finding } from './ledger-restorations.js';
import { ImpressionMethod, ScanFileType } from './enums.js';
import type { RouteContract } from './route-contract.js';

const note = NoteText(1000)
  .nullable()
  .default(null)
  .transform((s) => (s ? s : null));

export const ScanBodyEntryBody = z.object({
  siteId: z.uuid({ error: "Choose one of the restoration's sites" }),
  componentId: z.uuid({ error: 'Choose the scan body from the catalogue' }),
  lot: PlainText(40)
    .nullable()
    .default(null)
    .transform((s) => (s ? s : null)),
});

export const ImpressionBody = z.object({
  method: ImpressionMethod,
  takenOn: IsoDate,
  /** One per site for a digital impression; none for an analog one. */
  scanBodies: z.array(ScanBodyEntryBody).max(16, { error: 'At most 16 scan bodies' }).default([]),
  note,
});
export type ImpressionBody = z.input<typeof ImpressionBody>;

/** A new version: a field left out keeps its value. */
export const ImpressionAmendmentBody = z.object({
  ...keepingOmitted(ImpressionBody.partial({ method: true, takenOn: true }).shape),
  reason: NoteText(500).min(3, 'Say why the impression is amended (at least 3 characters)'),
});
export type ImpressionAmendmentBody = z.input<typeof ImpressionAmendmentBody>;

export const ScanBodyEntry = z.object({
  siteId: Id,
  fdi: z.number().int(),
  componentId: Id,
  name: z.string(),
  referenceCode: z.string(),
  lot: z.string().nullable(),
});
export type ScanBodyEntry = z.infer<typeof ScanBodyEntry>;

export const Impression = z.object({
  id: Id,
  restorationId: Id,
  method: ImpressionMethod,
  takenOn: IsoDate,
  scanBodies: z.array(ScanBodyEntry),
  note: z.string().nullable(),
  recordedBy: z.string(),
  recordedAt: IsoDateTime,
  supersedesId: Id.nullable(),
  amendmentReason: z.string().nullable(),
  /** False once a newer version supersedes this one. */
  current: z.boolean(),
});
export type Impression = z.infer<typeof Impression>;

export const ScanFile = z.object({
  id: Id,
  /** The version of the impression the file was uploaded to. */
  impressionId: Id,
  fileType: ScanFileType,
  originalName: z.string().nullable(),
  sizeBytes: z.number().int(),
  sha256: z.string(),
  uploadedBy: z.string(),
  uploadedAt: IsoDateTime,
});
export type ScanFile = z.infer<typeof ScanFile>;

/**
 * Every version of the restoration's impression, oldest first, and the scan files of all of them;
 * `findings`: what the current version still asks for (a seating radiograph of the scan bodies,
 * where the practice requires one).
 */
export const ImpressionListReply = z.object({
  items: z.array(Impression),
  scanFiles: z.array(ScanFile),
  findings: z.array(Finding),
});
export type ImpressionListReply = z.infer<typeof ImpressionListReply>;

/** The practice's impression rules: whether a digital impression asks for a scan-body radiograph (off by default). */
export const ImpressionSettings = z.object({
  requireScanBodyRadiograph: z.boolean({ error: 'Say whether the radiograph is asked for' }),
});
export type ImpressionSettings = z.infer<typeof ImpressionSettings>;

/** The upload's details travel in the query string: the body is the file's bytes. */
export const ScanFileUploadQuery = z.object({
  /** The client's file name, kept as data only (never used for the object key or the type). */
  fileName: NoteText(255)
    .optional()
    .transform((s) => (s ? s : null)),
});
export type ScanFileUploadQuery = z.input<typeof ScanFileUploadQuery>;

/**
 * One coordinate of a point picked on the mesh, in the scan file's own units. Finite and within a
 * metre of the file's origin (a scanner's mesh is a few centimetres across): anything else is no
 * point on a scan.
 */
const coordinate = z
  .number({ error: 'Give each coordinate as a finite number' })
  .min(-1000, { error: 'The point is far outside any scan (more than 1000 units from its origin)' })
  .max(1000, { error: 'The point is far outside any scan (more than 1000 units from its origin)' });

/** A point on the scan file's mesh, in the file's coordinates (as its vertices are written). */
export const MarkerPoint = z.object({ x: coordinate, y: coordinate, z: coordinate });
export type MarkerPoint = z.infer<typeof MarkerPoint>;

/**
 * Place, move or clear the marker of one recorded scan body on a scan file. A marker already
 * placed at the site is superseded by the new version (moved), or by one without a point (cleared).
 */
export const ScanBodyMarkerBody = z.object({
  siteId: z.uuid({ error: 'Choose the site of a scan body recorded with the impression' }),
  /** Where the scan body is on the mesh; null clears the marker. */
  point: MarkerPoint.nullable(),
});
export type ScanBodyMarkerBody = z.input<typeof ScanBodyMarkerBody>;

export const ScanBodyMarker = z.object({
  id: Id,
  scanFileId: Id,
  siteId: Id,
  fdi: z.number().int(),
  /** Null on a version that cleared the marker. */
  point: MarkerPoint.nullable(),
  placedBy: z.string(),
  placedAt: IsoDateTime,
  supersedesId: Id.nullable(),
  amendmentReason: z.string().nullable(),
});
export type ScanBodyMarker = z.infer<typeof ScanBodyMarker>;

/** The current marker of each scan body marked on the file (cleared ones left out), by site. */
export const ScanBodyMarkerListReply = z.object({ items: z.array(ScanBodyMarker) });
export type ScanBodyMarkerListReply = z.infer<typeof ScanBodyMarkerListReply>;

const r = (method: RouteContract['method'], path: string, summary: string, more: Partial<RouteContract> = {}) =>
  ({ method, path, summary, signedIn: true, ...more }) satisfies RouteContract;

export const impressionRoutes: RouteContract[] = [
  r('get', '/restorations/:id/impressions', "Every version of a restoration's impression, with its scan files", {
    reply: ImpressionListReply,
  }),
  r('post', '/restorations/:id/impressions', 'Record the impression: analog, or digital with a scan body per site', {
    body: ImpressionBody,
    reply: Impression,
  }),
  r('post', '/impressions/:id/amendments', 'Amend an impression: a new version superseding it, with the reason', {
    body: ImpressionAmendmentBody,
    reply: Impression,
  }),
  r(
    'post',
    '/impressions/:id/scan-files',
    'Upload a scan file (STL, PLY, OBJ) to a digital impression as application/octet-stream; type decided by its bytes',
    { query: ScanFileUploadQuery, reply: ScanFile },
  ),
  r('get', '/scan-files/:id/file', 'The scan file, as an attachment', { produces: 'application/octet-stream' }),
  r('get', '/scan-files/:id/markers', 'The scan bodies marked on a scan file: the current point of each', {
    reply: ScanBodyMarkerListReply,
  }),
  r(
    'post',
    '/scan-files/:id/markers',
    'Place, move (a new version superseding it) or clear (point null) the marker of a recorded scan body on a scan file',
    { body: ScanBodyMarkerBody, reply: ScanBodyMarker },
  ),
  r('get', '/practice/impression-settings', "The practice's impression rules", { reply: ImpressionSettings }),
  r('put', '/practice/impression-settings', 'Set whether a digital impression asks for a scan-body radiograph', {
    body: ImpressionSettings,
    reply: ImpressionSettings,
  }),
  r(
    'get',
    '/lab-files/:token',
    'A scan file through the time-limited link mailed to the lab (no session; 410 once expired, 404 when not valid)',
    { signedIn: false, produces: 'application/octet-stream' },
  ),
];
