import { pgEnum } from 'drizzle-orm/pg-core';

export const roleEnum = pgEnum('role', ['practice_admin', 'dentist', 'hygienist', 'surgeon']);
export const siteStatusEnum = pgEnum('site_status', ['planned', 'placed', 'restored', 'failed', 'removed']);
export const connectionEnum = pgEnum('connection', ['internal-conical', 'internal-hex', 'external-hex']);
export const componentKindEnum = pgEnum('component_kind', [
  'abutment-stock',
  'abutment-custom',
  'abutment-angled',
  'multi-unit-abutment',
  'abutment-screw',
  'prosthetic-screw',
  'set-screw',
  'impression-coping',
  'healing-abutment',
  'cover-screw',
]);
export const trayEnum = pgEnum('impression_tray', ['open', 'closed']);
export const loadingProtocolEnum = pgEnum('loading_protocol', ['immediate', 'early', 'conventional']);
export const restorationKindEnum = pgEnum('restoration_kind', ['single-crown', 'splinted-bridge', 'full-arch']);
export const retentionEnum = pgEnum('retention', ['screw-to-implant', 'screw-to-multi-unit', 'cement-on-abutment', 'lingual-set-screw']);
export const restorationStatusEnum = pgEnum('restoration_status', ['planned', 'delivered', 'removed']);
export const materialEnum = pgEnum('material', [
  'zirconia',
  'titanium-porcelain',
  'titanium-composite',
  'full-gold',
  'porcelain-fused-to-metal',
  'other',
]);
export const interfaceEnum = pgEnum('interface_kind', ['engaging', 'non-engaging']);
export const impressionCopingEnum = pgEnum('impression_coping_kind', ['engaging', 'non-engaging', 'multi-unit']);
export const torqueReasonEnum = pgEnum('torque_reason', [
  'initial-seating',
  're-torque-after-settling',
  're-torque-at-recall',
  'loosening-found',
  'screw-replaced',
]);
export const torqueVerdictEnum = pgEnum('torque_verdict', ['within', 'under', 'over']);
export const wrenchTypeEnum = pgEnum('wrench_type', ['spring', 'friction']);

export const complicationKindEnum = pgEnum('complication_kind', [
  'screw-loosening',
  'screw-fracture',
  'abutment-fracture',
  'veneer-chipping',
  'framework-fracture',
  'other',
]);
export const periImplantStatusEnum = pgEnum('peri_implant_status', ['health', 'mucositis', 'peri-implantitis']);
export const probingSiteEnum = pgEnum('probing_site', ['mesiobuccal', 'buccal', 'distobuccal', 'mesiolingual', 'lingual', 'distolingual']);
export const recallStatusEnum = pgEnum('recall_status', ['scheduled', 'done', 'cancelled']);
export const reminderKindEnum = pgEnum('reminder_kind', ['upcoming', 'overdue']);
export const reminderStatusEnum = pgEnum('reminder_status', ['pending', 'sent', 'failed']);
