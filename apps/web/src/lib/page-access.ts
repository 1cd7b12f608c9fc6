import type { Action, Subject } from '@torquetrail/authz';

/** What a signed-in page needs of the user's ability; null: every signed-in user. */
export interface PageNeed {
  action: Action;
  subject: Subject;
}

const need = (action: Action, subject: Subject): PageNeed => ({ action, subject });

/**
 * Every signed-in page of the router, by its full path, with what it needs: the same subjects and
 * actions as the API routes the page calls to do its work. The shell shows "not available to your
 * role" instead of a page the user's ability does not allow (app/router.tsx `access()`, app/page-gate.tsx), and the
 * browser test walks this table with every role.
 */
export const PAGE_ACCESS = {
  patients: need('read', 'Patient'),
  'patients/new': need('create', 'Patient'),
  'patients/:patientId': need('read', 'Patient'),
  'patients/:patientId/edit': need('update', 'Patient'),
  'patients/:patientId/sites/:siteId': need('read', 'ImplantSite'),
  'patients/:patientId/sites/:siteId/placement': need('create', 'Placement'),
  'patients/:patientId/restorations': need('read', 'Restoration'),
  'patients/:patientId/restorations/new': need('create', 'Restoration'),
  'patients/:patientId/radiographs': need('read', 'Radiograph'),
  'patients/:patientId/radiographs/:radiographId': need('read', 'Radiograph'),
  catalogue: need('read', 'Catalogue'),
  outcomes: need('read', 'Outcomes'),
  'lot-lookup': need('read', 'LotTrace'),
  'import-records': need('create', 'LegacyImport'),
  recalls: need('read', 'RecallExam'),
  'recalls/patients/:patientId/exam': need('create', 'RecallExam'),
  'recalls/policy': need('read', 'RecallPolicy'),
  'recalls/reminders': need('read', 'AuditEntry'),
  account: null,
  // The Practice screen opens to whoever has one of its pages: the administrator, and the dentist
  // for the practice's shares.
  practice: need('read', 'Share'),
  'practice/people': need('read', 'User'),
  'practice/sign-in': need('update', 'Practice'),
  'practice/contact': need('update', 'Practice'),
  'practice/patient-settings': need('update', 'Practice'),
  'practice/shares': need('read', 'Share'),
  'practice/audit': need('read', 'AuditEntry'),
} as const satisfies Record<string, PageNeed | null>;

export type PagePath = keyof typeof PAGE_ACCESS;

/** A route's `handle`: what its page needs (see PAGE_ACCESS). */
export interface PageHandle {
  access: PageNeed | null;
}

export const access = (path: PagePath): PageHandle => ({ access: PAGE_ACCESS[path] });
