// One CSV record → the contract's ImportRow (packages/contracts imports.ts): the cells are read as
// numbers, dates, yes/no and site lists, then the contract checks them like a form's body. No cell
// is ever evaluated; a formula-looking cell is an error of its own.
import {
  IMPORT_DEPTH_COLUMNS,
  IMPORT_SITE_CODES,
  ImportRow,
  type ImportColumn,
  type ImportIssue,
} from '@torquetrail/contracts';
import { isPrimaryTooth, isValidFdi, isValidIsoDate } from '@torquetrail/domain';
import { looksLikeFormula } from './csv-reader.js';

type Cells = Partial<Record<ImportColumn, string>>;

/** The contract's field names → the file's column names, for naming the column of a problem. */
const FIELD_COLUMNS: Record<string, ImportColumn> = {
  chartNumber: 'chart_number',
  familyName: 'family_name',
  givenName: 'given_name',
  birthDate: 'birth_date',
  lengthMm: 'length_mm',
  insertionTorqueNcm: 'insertion_torque_ncm',
  restorationKind: 'restoration_kind',
  restorationRef: 'restoration_ref',
  partRef: 'part_ref',
  partName: 'part_name',
  torqueNcm: 'torque_ncm',
  torqueReason: 'torque_reason',
  boneLevelMm: 'bone_level_mm',
  bleeding: 'bop',
  suppuration: 'sup',
};

export interface RowProblem {
  column: ImportColumn | null;
  message: string;
}

class CellError extends Error {
  constructor(
    readonly column: ImportColumn,
    message: string,
  ) {
    super(message);
  }
}

const text = (cells: Cells, c: ImportColumn) => {
  const v = cells[c]?.trim() ?? '';
  return v === '' ? null : v;
};

function number(cells: Cells, c: ImportColumn, decimalComma: boolean): number | null {
  const raw = text(cells, c);
  if (raw === null) return null;
  const normalised = decimalComma ? raw.replace(',', '.') : raw;
  if (!/^\d+(\.\d+)?$/.test(normalised)) throw new CellError(c, `"${raw}" is not a number`);
  return Number(normalised);
}

/** YYYY-MM-DD, or DD.MM.YYYY as European spreadsheets write it; an impossible date is refused. */
function date(cells: Cells, c: ImportColumn): string | null {
  const raw = text(cells, c);
  if (raw === null) return null;
  const dotted = /^(\d{1,2})\.(\d{1,2})\.(\d{4})$/.exec(raw);
  const iso = dotted ? `${dotted[3]}-${dotted[2].padStart(2, '0')}-${dotted[1].padStart(2, '0')}` : raw;
  if (!/^\d{4}-\d{2}-\d{2}$/.test(iso)) throw new CellError(c, `"${raw}" is not a date (write YYYY-MM-DD)`);
  if (!isValidIsoDate(iso)) throw new CellError(c, `${raw} is not a date that exists`);
  return iso;
}

function yesNo(cells: Cells, c: ImportColumn): boolean {
  const raw = text(cells, c)?.toLowerCase() ?? 'no';
  if (['yes', 'y', 'true', '1'].includes(raw)) return true;
  if (['no', 'n', 'false', '0'].includes(raw)) return false;
  throw new CellError(c, `"${raw}" is not yes or no`);
}

/** `bop` / `sup`: site codes separated by spaces (or "all" / "none"), as six flags in chart order. */
function siteFlags(cells: Cells, c: ImportColumn): boolean[] {
  const raw = text(cells, c)?.toLowerCase() ?? 'none';
  if (raw === 'all') return IMPORT_SITE_CODES.map(() => true);
  if (raw === 'none') return IMPORT_SITE_CODES.map(() => false);
  const codes = raw.split(/[\s|/]+/).filter(Boolean);
  for (const code of codes)
    if (!(IMPORT_SITE_CODES as readonly string[]).includes(code))
      throw new CellError(c, `"${code}" is not a probing site (use ${IMPORT_SITE_CODES.join(' ')})`);
  return IMPORT_SITE_CODES.map((code) => codes.includes(code));
}

function fdi(cells: Cells): number {
  const raw = text(cells, 'fdi');
  const value = raw !== null && /^\d{2}$/.test(raw) ? Number(raw) : NaN;
  if (!isValidFdi(value) || isPrimaryTooth(value))
    throw new CellError('fdi', `${raw ?? '(empty)'} is not an FDI (ISO 3950) position of a permanent tooth`);
  return value;
}

/** Reads one record; either the contract's row or the problems that stop it. */
export function readRow(cells: Cells, decimalComma: boolean): { row: ImportRow } | { problems: RowProblem[] } {
  const formulas = (Object.entries(cells) as [ImportColumn, string][])
    .filter(([, v]) => looksLikeFormula(v))
    .map(([column]) => ({
      column,
      message: 'Starts with = + - or @ like a spreadsheet formula: not imported (remove the sign or the formula)',
    }));
  if (formulas.length > 0) return { problems: formulas };
  let candidate: Record<string, unknown>;
  try {
    const common = {
      event: text(cells, 'event')?.toLowerCase() ?? null,
      chartNumber: text(cells, 'chart_number') ?? '',
      familyName: text(cells, 'family_name') ?? '',
      givenName: text(cells, 'given_name') ?? '',
      birthDate: date(cells, 'birth_date'),
      fdi: fdi(cells),
      date: date(cells, 'date'),
      notes: text(cells, 'notes'),
    };
    const n = (c: ImportColumn) => number(cells, c, decimalComma);
    switch (common.event) {
      case 'placement':
        candidate = {
          ...common,
          system: text(cells, 'system') ?? '',
          platform: text(cells, 'platform') ?? '',
          lengthMm: n('length_mm'),
          lot: text(cells, 'lot'),
          insertionTorqueNcm: n('insertion_torque_ncm'),
          surgeon: text(cells, 'surgeon'),
        };
        break;
      case 'delivery':
        candidate = {
          ...common,
          restorationKind: text(cells, 'restoration_kind'),
          retention: text(cells, 'retention'),
          material: text(cells, 'material'),
          interface: text(cells, 'interface') ?? undefined,
          restorationRef: text(cells, 'restoration_ref'),
        };
        break;
      case 'part':
        candidate = {
          ...common,
          partRef: text(cells, 'part_ref') ?? '',
          partName: text(cells, 'part_name'),
          lot: text(cells, 'lot'),
        };
        break;
      case 'torque':
        candidate = {
          ...common,
          partRef: text(cells, 'part_ref') ?? '',
          torqueNcm: n('torque_ncm'),
          torqueReason: text(cells, 'torque_reason') ?? undefined,
        };
        break;
      case 'exam':
        candidate = {
          ...common,
          depths: IMPORT_DEPTH_COLUMNS.map((c) => n(c)),
          bleeding: siteFlags(cells, 'bop'),
          suppuration: siteFlags(cells, 'sup'),
          boneLevelMm: n('bone_level_mm'),
          mobility: yesNo(cells, 'mobility'),
        };
        break;
      default:
        return {
          problems: [
            {
              column: 'event',
              message: `"${common.event ?? ''}" is not an event (placement, delivery, part, torque, exam)`,
            },
          ],
        };
    }
  } catch (e) {
    if (e instanceof CellError) return { problems: [{ column: e.column, message: e.message }] };
    throw e;
  }
  const parsed = ImportRow.safeParse(candidate);
  if (parsed.success) return { row: parsed.data };
  return {
    problems: parsed.error.issues.map((issue) => {
      const [field, index] = issue.path;
      const column =
        field === 'depths' && typeof index === 'number'
          ? IMPORT_DEPTH_COLUMNS[index]
          : (FIELD_COLUMNS[String(field)] ?? (String(field) as ImportColumn));
      const message = issue.code === 'invalid_type' && issue.input == null ? 'Required for this event' : issue.message;
      return { column, message };
    }),
  };
}

/** The problems of a row as report issues. */
export const asIssues = (row: number, level: ImportIssue['level'], problems: RowProblem[]): ImportIssue[] =>
  problems.map((p) => ({ row, column: p.column, level, message: p.message }));
