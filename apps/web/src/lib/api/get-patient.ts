// The patient (name, sites) is read by several features (Arch, planner breadcrumbs), so its query lives here.
import { PatientDetail } from '@torquetrail/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../api-client';

export const patientQueryKey = (patientId: string) => ['patients', 'detail', patientId] as const;

export function fetchPatient(patientId: string, signal?: AbortSignal): Promise<PatientDetail> {
  return apiRequest(`/api/patients/${encodeURIComponent(patientId)}`, { schema: PatientDetail, signal });
}

export const patientQueryOptions = (patientId: string) =>
  queryOptions({
    queryKey: patientQueryKey(patientId),
    queryFn: ({ signal }) => fetchPatient(patientId, signal),
  });

export function usePatient(patientId: string) {
  return useQuery(patientQueryOptions(patientId));
}
