import type { Material, RestorationKind, Retention } from '@torquetrail/contracts';

export const KIND_LABEL: Record<RestorationKind, string> = { 'single-crown': 'Single crown', 'splinted-bridge': 'Splinted bridge', 'full-arch': 'Full arch' };
export const RETENTION_LABEL: Record<Retention, string> = {
  'screw-to-implant': 'Screw-retained directly to the implant',
  'screw-to-multi-unit': 'Screw-retained to multi-unit abutments',
  'cement-on-abutment': 'Cement-retained on abutments',
  'lingual-set-screw': 'Lingual set-screw retained',
};
export const MATERIAL_LABEL: Record<Material, string> = {
  zirconia: 'Zirconia',
  'titanium-porcelain': 'Titanium framework with porcelain',
  'titanium-composite': 'Titanium framework with composite',
  'full-gold': 'Full gold',
  'porcelain-fused-to-metal': 'Porcelain fused to metal',
  other: 'Other',
};
