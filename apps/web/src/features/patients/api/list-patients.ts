import { PatientListReply } from '@torquetrail/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { patientKeys } from './keys';

function fetchPatientList(search: string, signal?: AbortSignal): Promise<PatientListReply> {
  const query = search ? `?${new URLSearchParams({ search })}` : '';
  return apiRequest(`/api/patients${query}`, { schema: PatientListReply, signal });
}

const patientListQueryOptions = (search: string) =>
  queryOptions({
    queryKey: patientKeys.list(search),
    queryFn: ({ signal }) => fetchPatientList(search, signal),
    // Keep the previous rows on screen while the next search loads, instead of flashing a spinner.
    placeholderData: keepPreviousData,
  });

export function usePatientList(search: string) {
  return useQuery(patientListQueryOptions(search));
}
