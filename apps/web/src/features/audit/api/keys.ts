import type { AuditQuery } from '@torquetrail/contracts';

/** The filters of the Audit page (the page cursor is the infinite query's, not the key's). */
export type AuditFilters = Partial<Pick<AuditQuery, 'patientId' | 'userId' | 'action' | 'from' | 'to'>>;

// Query keys of the audit feature.
export const auditKeys = {
  all: ['audit'] as const,
  practice: (filters: AuditFilters) => [...auditKeys.all, 'practice', filters] as const,
  patient: (patientId: string) => [...auditKeys.all, 'patient', patientId] as const,
  patientChoices: () => [...auditKeys.all, 'patient-choices'] as const,
};
