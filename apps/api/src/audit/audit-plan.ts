import type { Action, Subject } from '@torquetrail/authz';
import type { AuditAction } from '@torquetrail/contracts';
import type { AbilityCheck } from '../authz/check-ability.decorator.js';
import type { AuditPlan } from '../common/audit-context.js';
import type { AuditOverride } from './audit.decorator.js';

/**
 * Subjects whose reads return patient data: a GET declared on one of them is audited as a read.
 * Catalogue, wrenches, the recall policy, the practice and its users are not patient data.
 */
const PATIENT_DATA: ReadonlySet<Subject> = new Set<Subject>([
  'Patient',
  'PatientVersion',
  'ImplantSite',
  'Placement',
  'Restoration',
  'ComponentInstance',
  'TorqueEvent',
  'Complication',
  'RecallExam',
  'Radiograph',
  'Impression',
  'Share',
  'AuditEntry',
  'PatientAudit',
  'LotTrace',
  'Outcomes',
  'ReferralSummary',
  'PatientExport',
  'ImplantPassport',
]);

/** The audit action of a write, from the route's `@Allow(action, subject)`. */
function writeAction(action: Action, subject: Subject): AuditAction {
  switch (subject) {
    case 'Catalogue':
    case 'Wrench':
      return 'catalogue-change';
    case 'RecallPolicy':
    case 'Practice':
      return 'policy-change';
    case 'Share':
      return 'share-change';
    case 'User':
      return action === 'create' ? 'invite' : 'role-change';
    default:
      break;
  }
  // Archiving (and bringing back) a patient is its own action in the trail.
  if (action === 'archive') return 'archive';
  // A change to a patient record (a new version of it): `amend`, whatever verb its route uses.
  return action === 'create' ? 'create' : 'amend';
}

export interface RouteDeclarations {
  method: string;
  /** The route as Express matched it, `/api/sites/:id`. */
  path: string;
  check: AbilityCheck | undefined;
  override: AuditOverride | undefined;
  /** `@HttpCode(…)`, when the route declares one. */
  httpCode: number | undefined;
}

/**
 * What a route's audit row is, from what every route already declares: `@Allow(action, subject)`
 * and its HTTP method. A GET on patient data is a `read`; every write is audited, its action
 * following its subject; `@Audit(…)` overrides where the two differ. Null: not audited (health,
 * who-am-I, catalogue reads).
 */
export function auditPlanFor(route: RouteDeclarations): AuditPlan | null {
  const { method, check, override } = route;
  const isRead = method === 'GET' || method === 'HEAD';
  const subject = check && 'subject' in check ? check.subject : null;
  const base = {
    route: `${method} ${route.path.replace(/^\/api(?=\/)/, '')}`,
    successStatus: route.httpCode ?? (method === 'POST' ? 201 : 200),
  };
  if (override) {
    return {
      ...base,
      action: override.action,
      recordType: override.recordType ?? subject,
      inTransaction: !isRead && subject !== null,
    };
  }
  if (!check || !('action' in check)) return null;
  if (isRead) {
    return PATIENT_DATA.has(check.subject)
      ? { ...base, action: 'read', recordType: check.subject, inTransaction: false }
      : null;
  }
  return { ...base, action: writeAction(check.action, check.subject), recordType: check.subject, inTransaction: true };
}
