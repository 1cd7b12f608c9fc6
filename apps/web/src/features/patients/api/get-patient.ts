// The patient (name, sites) is read by several features (Arch, planner breadcrumbs, placement);
// they use it through this feature's index.ts.
import { PatientDetail } from '@torquetrail/contracts';
import { type QueryClient, queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { patientKeys } from './keys';

function fetchPatient(patientId: string, signal?: AbortSignal): Promise<PatientDetail> {
  return apiRequest(`/api/patients/${encodeURIComponent(patientId)}`, { schema: PatientDetail, signal });
}

const patientQueryOptions = (patientId: string) =>
  queryOptions({
    queryKey: patientKeys.detail(patientId),
    queryFn: ({ signal }) => fetchPatient(patientId, signal),
  });

/**
 * Starts reading the patient before the page's code has loaded (the route's loader), so the request
 * runs beside the session's and the page's chunk; the page's `usePatient` then finds it in the cache.
 */
export function prefetchPatient(queryClient: QueryClient, patientId: string): void {
  void queryClient.prefetchQuery(patientQueryOptions(patientId));
}

/** `enabled: false` for a caller that may have no patient (the print frame of a page without one). */
export function usePatient(patientId: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...patientQueryOptions(patientId), enabled: options.enabled ?? true });
}
