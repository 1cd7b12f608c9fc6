// One label per value of every clinical enum (the unit test beside lib/labels.ts checks that no
// enum and no value is missing). Where a label sits mid-sentence, callers lower-case it.
import {
  ABUTMENT_KINDS,
  type ComplicationKind,
  type InsertChangeReason,
  type ComponentKind,
  type Connection,
  type CopingLevel,
  type FindingSeverity,
  type ImpressionCopingKind,
  type ImpressionMethod,
  type InterfaceKind,
  type LoadingProtocol,
  type Material,
  type ProbingPosition,
  type RestorationKind,
  type RestorationStatus,
  type Retention,
  type ScanFileType,
  type SeatingAnswer,
  type SeatingEvent,
  type TorqueReason,
  type TorqueVerdict,
  type Tray,
  type WrenchType,
} from '@torquetrail/contracts';
import {
  type IcoiGrade,
  PERI_IMPLANT_FLAGS,
  type PeriImplantFlag,
  RETIGHTEN_AFTER_MINUTES,
  type RecallRiskFactor,
} from '@torquetrail/domain';

export const CONNECTION_LABEL: Record<Connection, string> = {
  'internal-conical': 'Internal conical',
  'internal-hex': 'Internal hex',
  'external-hex': 'External hex',
};

export const COMPONENT_KIND_LABEL: Record<ComponentKind, string> = {
  'abutment-stock': 'Stock abutment',
  'abutment-custom': 'Custom abutment',
  'abutment-angled': 'Angled abutment',
  'multi-unit-abutment': 'Multi-unit abutment',
  'abutment-screw': 'Abutment screw',
  'prosthetic-screw': 'Prosthetic screw',
  'set-screw': 'Lingual set screw',
  'impression-coping': 'Impression coping',
  'healing-abutment': 'Healing abutment',
  'cover-screw': 'Cover screw',
  'scan-body': 'Scan body',
  'attachment-abutment': 'Attachment abutment (stud)',
  'retentive-insert': 'Retentive insert',
  'bar-clip': 'Bar clip',
};

/** Kinds that sit on the implant and have an axis, so "straight" is meaningful for them. */
export const ANGLED_KINDS: readonly ComponentKind[] = [...ABUTMENT_KINDS, 'multi-unit-abutment'];

export const RETENTION_LABEL: Record<Retention, string> = {
  'screw-to-implant': 'Screw-retained directly to the implant',
  'screw-to-multi-unit': 'Screw-retained to multi-unit abutments',
  'cement-on-abutment': 'Cement-retained on abutments',
  'lingual-set-screw': 'Lingual set-screw retained',
};

export const RESTORATION_KIND_LABEL: Record<RestorationKind, string> = {
  'single-crown': 'Single crown',
  'splinted-bridge': 'Splinted bridge',
  'full-arch': 'Full-arch bridge',
  'overdenture-studs': 'Overdenture on stud attachments',
  'overdenture-bar': 'Overdenture on a bar',
};

export const MATERIAL_LABEL: Record<Material, string> = {
  zirconia: 'Zirconia',
  'titanium-porcelain': 'Titanium framework with porcelain',
  'titanium-composite': 'Titanium framework with composite',
  'full-gold': 'Full gold',
  'porcelain-fused-to-metal': 'Porcelain fused to metal',
  other: 'Other',
};

/** In the order the planner offers them: non-engaging first. */
export const INTERFACE_LABEL: Record<InterfaceKind, string> = {
  'non-engaging': 'Non-engaging',
  engaging: 'Engaging',
};

/** In the order the planner offers them. */
export const IMPRESSION_COPING_LABEL: Record<ImpressionCopingKind, string> = {
  'non-engaging': 'Non-engaging coping',
  engaging: 'Engaging coping',
  'multi-unit': 'Multi-unit coping',
};

export const IMPRESSION_METHOD_LABEL: Record<ImpressionMethod, string> = {
  analog: 'Analog (copings and tray)',
  digital: 'Digital (intraoral scan)',
};

export const SCAN_FILE_TYPE_LABEL: Record<ScanFileType, string> = {
  stl: 'STL mesh',
  ply: 'PLY mesh',
  obj: 'OBJ mesh',
};

export const RESTORATION_STATUS_LABEL: Record<RestorationStatus, string> = {
  planned: 'Planned',
  delivered: 'Delivered',
  removed: 'Removed',
};

export const FINDING_SEVERITY_LABEL: Record<FindingSeverity, string> = {
  error: 'Error',
  warning: 'Warning',
  info: 'Note',
};

export const COPING_LEVEL_LABEL: Record<CopingLevel, string> = {
  implant: 'Implant level',
  'multi-unit': 'On a multi-unit abutment',
};

export const TRAY_LABEL: Record<Tray, string> = {
  open: 'Open tray',
  closed: 'Closed tray',
};

export const WRENCH_TYPE_LABEL: Record<WrenchType, string> = {
  spring: 'Spring',
  friction: 'Friction',
};

export const LOADING_PROTOCOL_LABEL: Record<LoadingProtocol, string> = {
  immediate: 'Immediate',
  early: 'Early',
  conventional: 'Conventional',
};

/**
 * Built on first use, not when the module loads: the first Intl object of a page costs tens of ms
 * of ICU start-up, and the Arch's first view (which loads this module) writes no number with it.
 */
let number: Intl.NumberFormat | undefined;

export const formatNumber = (value: number): string =>
  (number ??= new Intl.NumberFormat('en-GB', { maximumFractionDigits: 1 })).format(value);

/** "35 N·cm ± 10 %", or "hand-tight" when there is no torque specification. */
export function formatTorqueSpec(specNcm: number | null, tolerancePct: number): string {
  if (specNcm === null) return 'hand-tight';
  return `${formatNumber(specNcm)} N·cm ± ${formatNumber(tolerancePct)} %`;
}

export const TORQUE_VERDICT_LABEL: Record<TorqueVerdict, string> = {
  within: 'Within specification',
  under: 'Under specification',
  over: 'Over specification',
};

/** Why a torque was applied; the settling delay is the domain's RETIGHTEN_AFTER_MINUTES (Siamos 2002). */
export const TORQUE_REASON_LABEL: Record<TorqueReason, string> = {
  'initial-seating': 'Initial seating',
  're-torque-after-settling': `Re-torque after settling (about ${RETIGHTEN_AFTER_MINUTES} min)`,
  're-torque-at-recall': 'Re-torque at recall',
  'loosening-found': 'Loosening found',
  'screw-replaced': 'Screw replaced (new part)',
};

export const COMPLICATION_KIND_LABEL: Record<ComplicationKind, string> = {
  'screw-loosening': 'Screw loosening',
  'screw-fracture': 'Screw fracture',
  'abutment-fracture': 'Abutment fracture',
  'veneer-chipping': 'Veneer chipping',
  'framework-fracture': 'Framework fracture',
  other: 'Other',
};

/** Why a retentive insert (or bar clip) was changed, in plain words. */
export const INSERT_CHANGE_REASON_LABEL: Record<InsertChangeReason, string> = {
  'retention-loss': 'Retention lost (the denture lifts)',
  wear: 'Worn',
  fracture: 'Broken',
};
/** Each reason's shade in the Timeline's insert-change chart: Torquetrail's teal family, a break darkest. */
export const INSERT_CHANGE_REASON_SHADE: Record<InsertChangeReason, string> = {
  'retention-loss': '#5fb3a8',
  wear: '#99c7c1',
  fracture: '#0f5c56',
};

/** Column heads of the probing grid (the full names are the values themselves, used in field names). */
export const PROBING_POSITION_ABBREVIATION: Record<ProbingPosition, string> = {
  mesiobuccal: 'MB',
  buccal: 'B',
  distobuccal: 'DB',
  mesiolingual: 'ML',
  lingual: 'L',
  distolingual: 'DL',
};

/** The flags of classifyPeriImplant, in words beside the computed status. */
export const PERI_IMPLANT_FLAG_LABEL: Record<PeriImplantFlag, string> = {
  [PERI_IMPLANT_FLAGS.NO_BASELINE]: 'No baseline: the no-baseline definition was used',
  [PERI_IMPLANT_FLAGS.PERI_IMPLANTITIS_NOT_EXCLUDED_WITHOUT_BASELINE]:
    'Peri-implantitis not excluded without a baseline',
  [PERI_IMPLANT_FLAGS.BONE_LEVEL_MISSING]: 'No bone level: bone loss cannot be judged',
  [PERI_IMPLANT_FLAGS.BONE_LOSS_WITHOUT_INFLAMMATION]: 'Bone loss without inflammation: review the radiograph',
};

export const RISK_FACTOR_LABEL: Record<RecallRiskFactor, string> = {
  smoker: 'Smoker',
  diabetesPoorlyControlled: 'Poorly controlled diabetes',
  periodontitisHistory: 'History of periodontitis',
  priorPeriImplantitis: 'Prior peri-implantitis',
};

/** ICOI Pisa health-scale groups (Misch et al. 2008), in the scale's own words. */
export const ICOI_GRADE_LABEL: Record<IcoiGrade, string> = {
  I: 'I · success',
  II: 'II · satisfactory survival',
  III: 'III · compromised survival',
  IV: 'IV · failure',
};
export const SEATING_EVENT_LABEL: Record<SeatingEvent, string> = {
  impression: 'Impression',
  delivery: 'Delivery',
};

/** What the radiograph showed of the seating; the Stack says SEATING_NOT_CHECKED when there is no check. */
export const SEATING_ANSWER_LABEL: Record<SeatingAnswer, string> = {
  yes: 'Seated',
  no: 'Not seated',
  unsure: 'Unsure',
};
export const SEATING_NOT_CHECKED = 'Not checked radiographically';
