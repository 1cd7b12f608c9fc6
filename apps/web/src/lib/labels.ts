// Labels of the non-clinical enums (roles, statuses, the Recall desk, the Timeline); clinical ones
// are in clinical-labels.ts. labels.test.ts checks that every enum has one label per value.
import type { Role } from '@torquetrail/authz';
import {
  DESK_DUE_SOON_DAYS,
  type DeskFilter,
  type DeskSort,
  type InvitationStatus,
  type MaintenanceStatus,
  type RadiographFileType,
  type RadiographKind,
  type ReminderKind,
  type ReminderStatus,
  type SiteStatus,
  type TimelineKind,
} from '@torquetrail/contracts';

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

/** How the Arch's accessible name words a site ("36, implant placed, …"): a restored site is just "implant". */
export const SITE_STATUS_PHRASE: Record<SiteStatus, string> = {
  restored: 'implant',
  placed: 'implant placed',
  planned: 'implant planned',
  failed: 'implant failed',
  removed: 'implant removed',
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

export const TIMELINE_KIND_LABEL: Record<TimelineKind, string> = {
  placement: 'Placement',
  plan: 'Plan',
  impression: 'Impression',
  'lab-prescription': 'Lab prescription',
  part: 'Parts',
  delivery: 'Delivery',
  torque: 'Torque',
  complication: 'Complication',
  'recall-exam': 'Recall exam',
};

export const DESK_FILTER_LABEL: Record<DeskFilter, string> = {
  all: 'All patients with implants',
  'due-this-week': `Due in the next ${DESK_DUE_SOON_DAYS} days`,
  overdue: 'Overdue',
  'peri-implantitis-last': 'Peri-implantitis last time',
};

/** Column heads of the Recall desk's sortable columns. */
export const DESK_SORT_LABEL: Record<DeskSort, string> = {
  name: 'Patient',
  dueOn: 'Next recall',
  overdueDays: 'Overdue',
  lastExamOn: 'Last exam',
};

export const REMINDER_KIND_LABEL: Record<ReminderKind, string> = {
  upcoming: 'Upcoming',
  overdue: 'Overdue',
};

export const INVITATION_STATUS_LABEL: Record<InvitationStatus, string> = {
  pending: 'Waiting for the invitee',
  expired: 'Link expired',
  accepted: 'Accepted',
  revoked: 'Withdrawn',
};

export const REMINDER_STATUS_LABEL: Record<ReminderStatus, string> = {
  pending: 'Pending',
  sent: 'Sent',
  failed: 'Failed',
};

export const RADIOGRAPH_KIND_LABEL: Record<RadiographKind, string> = {
  periapical: 'Periapical',
  bitewing: 'Bitewing',
  panoramic: 'Panoramic',
  'cbct-export': 'CBCT export',
  other: 'Other',
};

export const RADIOGRAPH_FILE_TYPE_LABEL: Record<RadiographFileType, string> = {
  png: 'PNG image',
  jpeg: 'JPEG image',
  dicom: 'DICOM file',
};
