// Every enumeration exported by the shared packages has one label map in the web, with a label for
// every value: a new enum, or a new value, without its words fails here. Label maps live in
// lib/labels.ts and lib/clinical-labels.ts only, never as per-feature copies.
import * as authz from '@torquetrail/authz';
import * as contracts from '@torquetrail/contracts';
import * as domain from '@torquetrail/domain';
import { describe, expect, it } from 'vitest';
import * as clinical from './clinical-labels';
import * as general from './labels';

type LabelMap = Readonly<Record<string, string>>;

/** The label map of each exported list, by the list's export name. */
const LABELS: Record<string, LabelMap> = {
  ROLES: general.ROLE_LABEL,
  SITE_STATUSES: general.SITE_STATUS_LABEL,
  LOT_LOOKUP_KINDS: general.LOT_LOOKUP_KIND_LABEL,
  LOT_ITEM_KINDS: general.LOT_ITEM_KIND_LABEL,
  OUTCOME_GROUPINGS: general.OUTCOME_GROUPING_LABEL,
  IMPLANT_OUTCOMES: general.IMPLANT_OUTCOME_LABEL,
  MAINTENANCE_STATUSES: general.MAINTENANCE_STATUS_LABEL,
  PERI_IMPLANT_STATUSES: general.MAINTENANCE_STATUS_LABEL,
  TIMELINE_KINDS: general.TIMELINE_KIND_LABEL,
  DESK_FILTERS: general.DESK_FILTER_LABEL,
  DESK_SORTS: general.DESK_SORT_LABEL,
  REMINDER_KINDS: general.REMINDER_KIND_LABEL,
  REMINDER_STATUSES: general.REMINDER_STATUS_LABEL,
  PATIENT_SEXES: general.PATIENT_SEX_LABEL,
  PREFERRED_LANGUAGES: general.PREFERRED_LANGUAGE_LABEL,
  ARCHIVE_FILTERS: general.ARCHIVE_FILTER_LABEL,
  PATIENT_VERSION_KINDS: general.PATIENT_VERSION_KIND_LABEL,
  PATIENT_RECORD_FIELDS: general.PATIENT_FIELD_LABEL,
  PATIENT_CONTACT_FIELDS: general.PATIENT_FIELD_LABEL,
  INVITATION_STATUSES: general.INVITATION_STATUS_LABEL,
  RADIOGRAPH_KINDS: general.RADIOGRAPH_KIND_LABEL,
  RADIOGRAPH_FILE_TYPES: general.RADIOGRAPH_FILE_TYPE_LABEL,
  AUDIT_ACTIONS: general.AUDIT_ACTION_LABEL,
  AUDIT_OUTCOMES: general.AUDIT_OUTCOME_LABEL,
  RADIOGRAPH_PREVIEW_STATUSES: general.RADIOGRAPH_PREVIEW_STATUS_LABEL,
  SHARE_SCOPES: general.SHARE_SCOPE_LABEL,
  SHARE_STATUSES: general.SHARE_STATUS_LABEL,
  DATE_FORMATS: general.DATE_FORMAT_LABEL,
  IMPORT_EVENTS: general.IMPORT_EVENT_LABEL,
  IMPORT_ISSUE_LEVELS: general.IMPORT_ISSUE_LEVEL_LABEL,
  IMPORT_PHASES: general.IMPORT_PHASE_LABEL,
  CONNECTIONS: clinical.CONNECTION_LABEL,
  LOADING_PROTOCOLS: clinical.LOADING_PROTOCOL_LABEL,
  COMPONENT_KINDS: clinical.COMPONENT_KIND_LABEL,
  ABUTMENT_KINDS: clinical.COMPONENT_KIND_LABEL,
  SCREW_KINDS: clinical.COMPONENT_KIND_LABEL,
  CLOSURE_KINDS: clinical.COMPONENT_KIND_LABEL,
  STACK_ORDER: clinical.COMPONENT_KIND_LABEL,
  DENTURE_RETAINER_KINDS: clinical.COMPONENT_KIND_LABEL,
  TRAYS: clinical.TRAY_LABEL,
  COPING_LEVELS: clinical.COPING_LEVEL_LABEL,
  WRENCH_TYPES: clinical.WRENCH_TYPE_LABEL,
  RESTORATION_KINDS: clinical.RESTORATION_KIND_LABEL,
  OVERDENTURE_KINDS: clinical.RESTORATION_KIND_LABEL,
  CANTILEVER_KINDS: clinical.RESTORATION_KIND_LABEL,
  RESTORATION_STATUSES: clinical.RESTORATION_STATUS_LABEL,
  RETENTIONS: clinical.RETENTION_LABEL,
  ABUTMENT_LEVEL_RETENTIONS: clinical.RETENTION_LABEL,
  IMPLANT_INTERFACES: clinical.INTERFACE_LABEL,
  IMPRESSION_COPINGS: clinical.IMPRESSION_COPING_LABEL,
  IMPRESSION_METHODS: clinical.IMPRESSION_METHOD_LABEL,
  SCAN_FILE_TYPES: clinical.SCAN_FILE_TYPE_LABEL,
  FINDING_SEVERITIES: clinical.FINDING_SEVERITY_LABEL,
  ACTIONABLE_SEVERITIES: clinical.FINDING_SEVERITY_LABEL,
  MATERIALS: clinical.MATERIAL_LABEL,
  TORQUE_VERDICTS: clinical.TORQUE_VERDICT_LABEL,
  TORQUE_REASONS: clinical.TORQUE_REASON_LABEL,
  SEATING_REASONS: clinical.TORQUE_REASON_LABEL,
  RETORQUE_REASONS: clinical.TORQUE_REASON_LABEL,
  COMPLICATION_KINDS: clinical.COMPLICATION_KIND_LABEL,
  INSERT_CHANGE_REASONS: clinical.INSERT_CHANGE_REASON_LABEL,
  SEATING_EVENTS: clinical.SEATING_EVENT_LABEL,
  SEATING_ANSWERS: clinical.SEATING_ANSWER_LABEL,
  PROBING_POSITIONS: clinical.PROBING_POSITION_ABBREVIATION,
  RECALL_RISK_FACTORS: clinical.RISK_FACTOR_LABEL,
  ICOI_GRADES: clinical.ICOI_GRADE_LABEL,
};

/** Lists whose values are never shown to a person as words, each with the reason. */
const NOT_SHOWN: Record<string, string> = {
  SERVICE_STATES: 'the health route serves monitoring; the web never shows it',
  SORT_DIRECTIONS: 'shown as a caret icon and aria-sort, not as words',
  RECALL_STATUSES: 'the Recall desk shows the next scheduled date, never a recall status',
  RESTORATIVE_DESIGNS: "worded inside Finding messages by the domain's RESTORATIVE_DESIGN_LABELS",
  SHARED_PATIENT_FIELDS: 'the field names of the patient reply a share opens (CASL field rules), never shown',
  SHARE_NOTICE_KINDS: 'which e-mail the API sends the surgeon; worded in the e-mail, never shown in the web',
  SYMBOLOGY_IDENTIFIERS: 'barcode prefixes read by the UDI parser, never displayed',
  IMPORT_REQUIRED_COLUMNS: 'column names of the import file, shown as the file writes them (docs/import.md)',
  IMPORT_OPTIONAL_COLUMNS: 'column names of the import file, shown as the file writes them (docs/import.md)',
  IMPORT_COLUMNS: 'column names of the import file, shown as the file writes them (docs/import.md)',
  IMPORT_DEPTH_COLUMNS: 'column names of the import file, shown as the file writes them (docs/import.md)',
  IMPORT_SITE_CODES: 'probing-site codes of the import file, shown as the file writes them (docs/import.md)',
};

const packages = { authz, contracts, domain } as Record<string, Record<string, unknown>>;

/** Every exported non-empty list of strings, by export name (a name exported twice is checked twice). */
const lists: [string, string, readonly string[]][] = Object.entries(packages).flatMap(([pkg, exports]) =>
  Object.entries(exports)
    .filter(
      (entry): entry is [string, readonly string[]] =>
        Array.isArray(entry[1]) && entry[1].length > 0 && entry[1].every((v) => typeof v === 'string'),
    )
    .map(([name, values]) => [pkg, name, values] as [string, string, readonly string[]]),
);

/** Every zod enum schema of the contracts, with its options. */
const zodEnums = Object.entries(contracts).flatMap(([name, value]) => {
  const def = (value as { def?: { type?: string } } | null)?.def;
  return def?.type === 'enum' ? [[name, (value as unknown as { options: readonly string[] }).options] as const] : [];
});

describe('one label map per enum', () => {
  it('finds the exported lists and zod enums (the scan itself works)', () => {
    const names = lists.map(([, name]) => name);
    expect(names).toEqual(
      expect.arrayContaining(['ROLES', 'TORQUE_VERDICTS', 'TORQUE_REASONS', 'COMPONENT_KINDS', 'PROBING_POSITIONS']),
    );
    expect(zodEnums.map(([name]) => name)).toEqual(
      expect.arrayContaining(['Role', 'TorqueVerdict', 'TorqueReason', 'Connection']),
    );
  });

  it.each(lists)('%s %s has a label for every value, or is listed as never shown', (_pkg, name, values) => {
    if (name in NOT_SHOWN) return;
    const labels = LABELS[name];
    expect(
      labels,
      `no label map for ${name}: add one to lib/labels.ts or lib/clinical-labels.ts and register it here`,
    ).toBeDefined();
    const missing = values.filter((value) => !labels[value]?.trim());
    expect(missing, `${name} values without a label`).toEqual([]);
  });

  it('every contracts zod enum is built from an exported list (so the check above covers it)', () => {
    const unlisted = zodEnums.filter(
      ([, options]) =>
        !lists.some(([, , values]) => values.length === options.length && values.every((v, i) => v === options[i])),
    );
    expect(unlisted.map(([name]) => name)).toEqual([]);
  });

  it('the flags of classifyPeriImplant have words', () => {
    const missing = Object.values(domain.PERI_IMPLANT_FLAGS).filter(
      (flag) => !(clinical.PERI_IMPLANT_FLAG_LABEL as LabelMap)[flag]?.trim(),
    );
    expect(missing).toEqual([]);
  });

  it('names no list in the registers that no package exports any more', () => {
    const exported = new Set(lists.map(([, name]) => name));
    expect([...Object.keys(LABELS), ...Object.keys(NOT_SHOWN)].filter((name) => !exported.has(name))).toEqual([]);
  });
});

describe('no per-feature label copies', () => {
  // Vite reads the feature sources as text (the web's type-check has no Node types).
  const sources: Record<string, string> = import.meta.glob(
    ['../features/**/*.{ts,tsx}', '!../features/**/*.test.{ts,tsx}'],
    { query: '?raw', import: 'default', eager: true },
  );
  const enumTypes = new Set([...zodEnums.map(([name]) => name), 'RecallRiskFactor', 'PeriImplantFlag']);
  const listNames = new Set(lists.map(([, name]) => name));
  // `Record<TorqueVerdict, string>` or `Record<(typeof DESK_FILTERS)[number], string>`.
  const labelMap = /Record<\s*(?:\(typeof\s+(\w+)\)\[number\]|(\w+))\s*,\s*string\s*>/g;

  it('finds the feature sources (the scan itself works)', () => {
    expect(Object.keys(sources).length).toBeGreaterThan(20);
    expect(Object.values(sources).some((text) => text.includes('TORQUE_REASON_LABEL'))).toBe(true);
  });

  it('no feature declares its own string map keyed by an enum', () => {
    const offenders = Object.entries(sources).flatMap(([file, text]) =>
      [...text.matchAll(labelMap)]
        .filter(
          ([, list, type]) =>
            (list !== undefined && listNames.has(list)) || (type !== undefined && enumTypes.has(type)),
        )
        .map(([match]) => `${file}: ${match}`),
    );
    expect(offenders).toEqual([]);
  });
});
