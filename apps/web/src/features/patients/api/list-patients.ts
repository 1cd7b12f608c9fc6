import { type ArchiveFilter, PatientListReply } from '@torquetrail/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { patientKeys } from './keys';

function fetchPatientList(search: string, archived: ArchiveFilter, signal?: AbortSignal): Promise<PatientListReply> {
  const params = new URLSearchParams(search ? { search } : {});
  if (archived !== 'active') params.set('archived', archived);
  const query = params.size > 0 ? `?${params}` : '';
  return apiRequest(`/api/patients${query}`, { schema: PatientListReply, signal });
}

const patientListQueryOptions = (search: string, archived: ArchiveFilter) =>
  queryOptions({
    queryKey: patientKeys.list(search, archived),
    queryFn: ({ signal }) => fetchPatientList(search, archived, signal),
    // Keep the previous rows on screen while the next search loads, instead of flashing a spinner.
    placeholderData: keepPreviousData,
  });

export function usePatientList(search: string, archived: ArchiveFilter = 'active') {
  return useQuery(patientListQueryOptions(search, archived));
}
