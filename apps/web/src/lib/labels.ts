import type { Role } from '@torquetrail/authz';
import type { MaintenanceStatus, SiteStatus } from '@torquetrail/contracts';

export const ROLE_LABEL: Record<Role, string> = {
  dentist: 'Restorative dentist',
  hygienist: 'Dental hygienist',
  surgeon: 'Referring surgeon',
  practice_admin: 'Practice administrator',
};

export const SITE_STATUS_LABEL: Record<SiteStatus, string> = {
  planned: 'Planned',
  placed: 'Placed',
  restored: 'Restored',
  failed: 'Failed',
  removed: 'Removed',
};

export const MAINTENANCE_STATUS_LABEL: Record<MaintenanceStatus, string> = {
  health: 'peri-implant health',
  mucositis: 'peri-implant mucositis',
  'peri-implantitis': 'peri-implantitis',
  'not-examined': 'not yet examined',
};

/** Shown wherever a computed maintenance status is shown. */
export const MAINTENANCE_NOTE =
  "Computed from the 2017 World Workshop case definitions; supports, never replaces, the clinician's diagnosis.";
