// Fetchers and hooks of the audit routes (one contract each, from @torquetrail/contracts).
import { AuditPage, PatientListReply, PracticeAuditPage } from '@torquetrail/contracts';
import { useInfiniteQuery, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { type AuditFilters, auditKeys } from './keys';

const PAGE_SIZE = 50;

/** `?patientId=…&from=…`: the filters that are set, for the page and for the CSV link alike. */
export function auditSearch(filters: AuditFilters, extra: Record<string, string> = {}): string {
  const q = new URLSearchParams();
  for (const [k, v] of Object.entries({ ...filters, ...extra })) if (v) q.set(k, v);
  const text = q.toString();
  return text ? `?${text}` : '';
}

/** The practice's trail, newest first, one keyset page after another ("Show older"). */
export const usePracticeAudit = (filters: AuditFilters) =>
  useInfiniteQuery({
    queryKey: auditKeys.practice(filters),
    queryFn: ({ pageParam, signal }) =>
      apiRequest(
        `/api/audit${auditSearch(filters, { pageSize: String(PAGE_SIZE), ...(pageParam ? { before: pageParam } : {}) })}`,
        { schema: PracticeAuditPage, signal },
      ),
    initialPageParam: '',
    getNextPageParam: (last) => last.nextBefore ?? undefined,
  });

/** Who accessed one patient's record. */
export const usePatientAudit = (patientId: string, enabled: boolean) =>
  useInfiniteQuery({
    queryKey: auditKeys.patient(patientId),
    queryFn: ({ pageParam, signal }) =>
      apiRequest(
        `/api/patients/${encodeURIComponent(patientId)}/audit${auditSearch({}, { pageSize: String(PAGE_SIZE), ...(pageParam ? { before: pageParam } : {}) })}`,
        { schema: AuditPage, signal },
      ),
    initialPageParam: '',
    getNextPageParam: (last) => last.nextBefore ?? undefined,
    enabled,
  });

/** The practice's patients, for the patient filter. */
export const usePatientChoices = () =>
  useQuery({
    queryKey: auditKeys.patientChoices(),
    queryFn: ({ signal }) => apiRequest('/api/patients', { schema: PatientListReply, signal }),
  });
