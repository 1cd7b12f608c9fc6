// The words the records that leave the practice use for our enum values: plain language a
// patient or a clinician elsewhere reads without our screens. Each map is exhaustive over its
// list (a new value fails type-checking until it has words).
import type { ComponentKind, Connection, Material, RestorationKind, Retention } from '@torquetrail/contracts';
import type { PeriImplantStatus, ProbingPosition, TorqueReason } from '@torquetrail/domain';

const PART_KIND: Record<ComponentKind, string> = {
  'abutment-stock': 'Stock abutment',
  'abutment-custom': 'Custom abutment',
  'abutment-angled': 'Angled abutment',
  'multi-unit-abutment': 'Multi-unit abutment',
  'abutment-screw': 'Abutment screw',
  'prosthetic-screw': 'Prosthetic screw',
  'set-screw': 'Set screw',
  'impression-coping': 'Impression coping',
  'healing-abutment': 'Healing abutment',
  'cover-screw': 'Cover screw',
  'scan-body': 'Scan body',
  'attachment-abutment': 'Attachment abutment (stud)',
  'retentive-insert': 'Retentive insert',
  'bar-clip': 'Bar clip',
};
export const partKindWords = (k: ComponentKind) => PART_KIND[k];

export const deviceKindWords = (k: ComponentKind | 'dental-implant') =>
  k === 'dental-implant' ? 'Dental implant' : PART_KIND[k];

const PROBING: Record<ProbingPosition, string> = {
  mesiobuccal: 'mesiobuccal',
  buccal: 'buccal',
  distobuccal: 'distobuccal',
  mesiolingual: 'mesiolingual',
  lingual: 'lingual',
  distolingual: 'distolingual',
};
export const probingWords = (p: ProbingPosition) => PROBING[p];

const STATUS: Record<PeriImplantStatus, string> = {
  health: 'peri-implant health',
  mucositis: 'peri-implant mucositis',
  'peri-implantitis': 'peri-implantitis',
};
export const statusWords = (s: PeriImplantStatus) => STATUS[s];

const KIND: Record<RestorationKind, string> = {
  'single-crown': 'a single crown',
  'splinted-bridge': 'a bridge joined across several implants',
  'full-arch': 'a full-arch fixed prosthesis',
  'overdenture-studs': 'a removable overdenture on stud attachments',
  'overdenture-bar': 'a removable overdenture on a bar',
};
export const restorationKindWords = (k: RestorationKind) => KIND[k];

const RETENTION: Record<Retention, string> = {
  'screw-to-implant': 'screwed directly onto the implant',
  'screw-to-multi-unit': 'screwed onto multi-unit abutments',
  'cement-on-abutment': 'cemented onto an abutment',
  'lingual-set-screw': 'held by a small set screw from the tongue side',
};
export const retentionWords = (r: Retention) => RETENTION[r];

const MATERIAL: Record<Material, string> = {
  zirconia: 'zirconia',
  'titanium-porcelain': 'titanium framework with porcelain',
  'titanium-composite': 'titanium framework with composite teeth',
  'full-gold': 'gold',
  'porcelain-fused-to-metal': 'porcelain fused to metal',
  other: 'another material',
};
export const materialWords = (m: Material) => MATERIAL[m];

const CONNECTION: Record<Connection, string> = {
  'internal-conical': 'internal conical',
  'internal-hex': 'internal hex',
  'external-hex': 'external hex',
};
export const connectionWords = (c: Connection) => CONNECTION[c];

const REASON: Record<TorqueReason, string> = {
  'initial-seating': 'seated',
  're-torque-after-settling': 're-tightened after settling',
  're-torque-at-recall': 're-tightened at a recall',
  'loosening-found': 'found loose and tightened',
  'screw-replaced': 'screw replaced',
};
export const torqueReasonWords = (r: TorqueReason) => REASON[r];
