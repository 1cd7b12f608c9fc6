// Legacy CSV import (docs/import.md): the columns, one row's checks per event, the dry-run
// report, the mapping of unknown parts, progress and the result. The row checks reuse the
// ledger's own field schemas, so an imported value passes exactly what a form would accept.
import { z } from 'zod';
import { PROBING_POSITIONS, TORQUE_NCM_RANGE } from '@torquetrail/domain';
import { FdiPosition, Id, IsoDate, NoteText, PlainText } from './common.js';
import { ImportIssueLevel, InterfaceKind, Material, RestorationKind, Retention, TorqueReason } from './enums.js';
import { IMPLANT_LENGTH_MM_RANGE, INSERTION_TORQUE_NCM_RANGE } from './placements.js';
import { ProbingDepthMm } from './recalls.js';
import type { RouteContract } from './route-contract.js';

/** The columns every row fills (docs/import.md). */
export const IMPORT_REQUIRED_COLUMNS = [
  'event',
  'chart_number',
  'family_name',
  'given_name',
  'birth_date',
  'fdi',
  'date',
] as const;

/** The probing depth columns, in the order of PROBING_POSITIONS. */
export const IMPORT_DEPTH_COLUMNS = ['pd_mb', 'pd_b', 'pd_db', 'pd_ml', 'pd_l', 'pd_dl'] as const;
/** The short codes of the six probing sites in `bop` / `sup`, in the order of PROBING_POSITIONS. */
export const IMPORT_SITE_CODES = ['mb', 'b', 'db', 'ml', 'l', 'dl'] as const;
/** The probing position of a `bop` / `sup` code, or null for an unknown code. */
export const importPositionOfCode = (code: string) => {
  const i = (IMPORT_SITE_CODES as readonly string[]).indexOf(code);
  return i < 0 ? null : PROBING_POSITIONS[i];
};

/** Columns read by some events only. */
export const IMPORT_OPTIONAL_COLUMNS = [
  'system',
  'platform',
  'length_mm',
  'lot',
  'insertion_torque_ncm',
  'surgeon',
  'restoration_kind',
  'retention',
  'material',
  'interface',
  'part_ref',
  'part_name',
  'torque_ncm',
  'torque_reason',
  ...IMPORT_DEPTH_COLUMNS,
  'bop',
  'sup',
  'bone_level_mm',
  'mobility',
  'notes',
  'restoration_ref',
] as const;
export const IMPORT_COLUMNS = [...IMPORT_REQUIRED_COLUMNS, ...IMPORT_OPTIONAL_COLUMNS] as const;
export type ImportColumn = (typeof IMPORT_COLUMNS)[number];

/** Default upper limit of an import file (the API's IMPORT_MAX_BYTES overrides it). */
export const IMPORT_DEFAULT_MAX_BYTES = 50 * 1024 * 1024;

const between = (what: string, min: number, max: number, unit: string) =>
  `${what} must be between ${min} and ${max} ${unit}`;
const mmNumber = (what: string, min: number, max: number) =>
  z
    .number({ error: `${what} must be a number` })
    .min(min, between(what, min, max, 'mm'))
    .max(max, between(what, min, max, 'mm'));

/** What every row says about its patient, its site and when. */
export const ImportRowCommon = z.object({
  chartNumber: PlainText(40).min(1, 'Enter the chart number'),
  familyName: PlainText(100).min(1, 'Enter the family name'),
  givenName: PlainText(100).min(1, 'Enter the given name'),
  birthDate: IsoDate,
  fdi: FdiPosition,
  date: IsoDate,
  notes: NoteText(2000).nullable(),
});

export const ImportPlacementRow = ImportRowCommon.extend({
  event: z.literal('placement'),
  system: PlainText(100).min(1, 'Enter the implant system'),
  platform: PlainText(100).min(1, 'Enter the platform'),
  lengthMm: mmNumber('Length', IMPLANT_LENGTH_MM_RANGE.min, IMPLANT_LENGTH_MM_RANGE.max),
  lot: PlainText(40).nullable(),
  insertionTorqueNcm: z
    .number()
    .min(INSERTION_TORQUE_NCM_RANGE.min, between('Insertion torque', 5, 100, 'N·cm'))
    .max(INSERTION_TORQUE_NCM_RANGE.max, between('Insertion torque', 5, 100, 'N·cm'))
    .nullable(),
  surgeon: PlainText(200).nullable(),
});

export const ImportDeliveryRow = ImportRowCommon.extend({
  event: z.literal('delivery'),
  restorationKind: RestorationKind,
  retention: Retention,
  material: Material,
  interface: InterfaceKind.default('engaging'),
  /** Tells apart two bridges of one patient delivered on the same day (docs/import.md, "Bridges"). */
  restorationRef: PlainText(40).nullable(),
});

export const ImportPartRow = ImportRowCommon.extend({
  event: z.literal('part'),
  partRef: PlainText(80).min(1, 'Enter the part reference'),
  partName: PlainText(200).nullable(),
  lot: PlainText(40).nullable(),
});

const torqueRange = between('Torque', TORQUE_NCM_RANGE.min, TORQUE_NCM_RANGE.max, 'N·cm');
export const ImportTorqueRow = ImportRowCommon.extend({
  event: z.literal('torque'),
  partRef: PlainText(80).min(1, 'Enter the part reference'),
  torqueNcm: z
    .number({ error: 'Enter the applied torque in N·cm' })
    .min(TORQUE_NCM_RANGE.min, torqueRange)
    .max(TORQUE_NCM_RANGE.max, torqueRange),
  torqueReason: TorqueReason.exclude(['screw-replaced']).default('initial-seating'),
});

export const ImportExamRow = ImportRowCommon.extend({
  event: z.literal('exam'),
  depths: z.array(ProbingDepthMm).length(6),
  bleeding: z.array(z.boolean()).length(6),
  suppuration: z.array(z.boolean()).length(6),
  boneLevelMm: mmNumber('Bone level', 0, 20).nullable(),
  mobility: z.boolean(),
});

/** One row as the import reads it, by its event. */
export const ImportRow = z.discriminatedUnion('event', [
  ImportPlacementRow,
  ImportDeliveryRow,
  ImportPartRow,
  ImportTorqueRow,
  ImportExamRow,
]);
export type ImportRow = z.output<typeof ImportRow>;

/** What the user chose for a part reference that is not in the catalogue. */
export const ImportPartMapping = z.union([
  z.object({ partRef: PlainText(80), componentId: Id }),
  z.object({ partRef: PlainText(80), freeText: z.literal(true) }),
]);
export type ImportPartMapping = z.infer<typeof ImportPartMapping>;

const mappingsParam = z
  .string()
  .max(100_000)
  .default('[]')
  .transform((s, ctx) => {
    try {
      return JSON.parse(s) as unknown;
    } catch {
      ctx.addIssue({ code: 'custom', message: 'The part mappings are not valid JSON' });
      return z.NEVER;
    }
  })
  .pipe(z.array(ImportPartMapping).max(1000));

/** The query of a dry run and of an import: the file travels as the body (application/octet-stream). */
export const ImportQuery = z.object({
  fileName: PlainText(200).min(1, 'Name the file'),
  /** Chosen by the page, so it can poll the progress of this run while the request runs. */
  runId: Id,
  /** JSON list of ImportPartMapping (part references not in the catalogue). */
  mappings: mappingsParam,
});
export type ImportQuery = z.input<typeof ImportQuery>;

export const ImportIssue = z.object({
  /** The row number as a spreadsheet shows it (the header is row 1); 0 for the file as a whole. */
  row: z.number().int(),
  column: z.string().nullable(),
  level: ImportIssueLevel,
  message: z.string(),
});
export type ImportIssue = z.infer<typeof ImportIssue>;

/** Rows read, patients and sites that would be (or were) written, and records per event. */
export const ImportCounts = z.object({
  rows: z.number().int(),
  patientsNew: z.number().int(),
  patientsMatched: z.number().int(),
  sites: z.number().int(),
  placement: z.number().int(),
  delivery: z.number().int(),
  part: z.number().int(),
  torque: z.number().int(),
  exam: z.number().int(),
});
export type ImportCounts = z.infer<typeof ImportCounts>;

/** A part reference that is not in the catalogue, with the rows that use it. */
export const UnknownPart = z.object({
  partRef: z.string(),
  partName: z.string().nullable(),
  rows: z.array(z.number()),
});

export const ImportReport = z.object({
  fileName: z.string(),
  sha256: z.string(),
  encoding: z.enum(['utf-8', 'utf-8-bom', 'windows-1252']),
  delimiter: z.enum([',', ';']),
  counts: ImportCounts,
  errors: z.number().int(),
  warnings: z.number().int(),
  issues: z.array(ImportIssue),
  unknownParts: z.array(UnknownPart),
  /** The catalogue parts an unknown reference may be mapped to. */
  catalogueParts: z.array(z.object({ id: Id, referenceCode: z.string(), name: z.string(), platformName: z.string() })),
  /** Set when this file was imported before: importing it again changes nothing. */
  alreadyImportedAt: z.string().nullable(),
});
export type ImportReport = z.infer<typeof ImportReport>;

export const ImportResult = z.object({
  importId: Id,
  fileName: z.string(),
  sha256: z.string(),
  /** False when the same file had been imported before and nothing was written now. */
  written: z.boolean(),
  counts: ImportCounts,
  /** Patients touched by the import, so the page can link to their records. */
  patients: z.array(z.object({ id: Id, chartNumber: z.string(), name: z.string() })).max(50),
  importedAt: z.string(),
});
export type ImportResult = z.infer<typeof ImportResult>;

export const IMPORT_PHASES = ['reading', 'checking', 'writing', 'done', 'failed'] as const;
export const ImportProgress = z.object({
  runId: Id,
  phase: z.enum(IMPORT_PHASES),
  rowsRead: z.number().int(),
  /** Records written so far, of `recordsToWrite` (known once the checks are done). */
  rowsWritten: z.number().int(),
  recordsToWrite: z.number().int().nullable(),
  totalRows: z.number().int().nullable(),
});
export type ImportProgress = z.infer<typeof ImportProgress>;

export const importRoutes: RouteContract[] = [
  {
    method: 'post',
    path: '/imports/dry-run',
    summary: 'Check a legacy CSV (the body, application/octet-stream) and report; nothing is written',
    signedIn: true,
    query: ImportQuery,
    reply: ImportReport,
    status: 200,
  },
  {
    method: 'post',
    path: '/imports',
    summary: 'Import a legacy CSV (the body) in one transaction; the same file again changes nothing',
    signedIn: true,
    query: ImportQuery,
    reply: ImportResult,
  },
  {
    method: 'get',
    path: '/imports/progress/:runId',
    summary: 'Progress of a dry run or import the page started',
    signedIn: true,
    reply: ImportProgress,
  },
];
