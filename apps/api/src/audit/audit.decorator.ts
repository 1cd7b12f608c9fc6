import { SetMetadata } from '@nestjs/common';
import type { AuditAction } from '@torquetrail/contracts';

export const AUDIT_OVERRIDE = 'torquetrail:audit';

export interface AuditOverride {
  action: AuditAction;
  recordType?: string;
}

/**
 * Only where a route's audit action differs from what its `@Allow` says (audit/audit-plan.ts):
 * downloads are `export`, sign-in and sign-out are public routes with their own actions.
 */
export const Audit = (action: AuditAction, recordType?: string) =>
  SetMetadata(AUDIT_OVERRIDE, { action, recordType } satisfies AuditOverride);
