import type {
  ComponentKind,
  Connection,
  InterfaceKind,
  Material,
  Placement,
  RestorationKind,
  Retention,
} from '@torquetrail/contracts';

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
};

/** Kinds that sit on the implant and have an axis, so "straight" is meaningful for them. */
export const ANGLED_KINDS: readonly ComponentKind[] = [
  'abutment-stock',
  'abutment-custom',
  'abutment-angled',
  'multi-unit-abutment',
];

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
};

export const MATERIAL_LABEL: Record<Material, string> = {
  zirconia: 'Zirconia',
  'titanium-porcelain': 'Titanium framework with porcelain',
  'titanium-composite': 'Titanium framework with composite',
  'full-gold': 'Full gold',
  'porcelain-fused-to-metal': 'Porcelain fused to metal',
  other: 'Other',
};

export const INTERFACE_LABEL: Record<InterfaceKind, string> = {
  engaging: 'Engaging',
  'non-engaging': 'Non-engaging',
};

export const LOADING_PROTOCOL_LABEL: Record<NonNullable<Placement['loadingProtocol']>, string> = {
  immediate: 'Immediate',
  early: 'Early',
  conventional: 'Conventional',
};

const number = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 1 });

export const formatNumber = (value: number): string => number.format(value);

/** "35 N·cm ± 10 %", or "hand-tight" when there is no torque specification. */
export function formatTorqueSpec(specNcm: number | null, tolerancePct: number): string {
  if (specNcm === null) return 'hand-tight';
  return `${formatNumber(specNcm)} N·cm ± ${formatNumber(tolerancePct)} %`;
}

const REASON_LABEL: Record<string, string> = {
  'initial-seating': 'Initial seating',
  're-torque-after-settling': 'Re-torque after settling',
  're-torque-at-recall': 'Re-torque at recall',
  're-torque': 'Re-torque',
  retorque: 'Re-torque',
  'loosening-found': 'Loosening found',
  'screw-replaced': 'Screw replaced',
};

/** Torque-event reasons arrive as codes ("re-torque"); unknown codes are shown as words. */
export function formatReason(reason: string): string {
  const known = REASON_LABEL[reason];
  if (known) return known;
  const words = reason.replace(/[-_]+/g, ' ').trim();
  return words.charAt(0).toUpperCase() + words.slice(1);
}
