// Creating, editing and archiving patients; their version history; the duplicate check; the
// practice's chart-number prefix.
import {
  type ArchivePatientBody,
  type CreatePatientBody,
  DuplicateCheckReply,
  PatientDetail,
  PatientSettingsReply,
  type PatientSettingsBody,
  PatientVersionsReply,
  type UpdatePatientBody,
} from '@torquetrail/contracts';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { patientKeys } from './keys';

const patientPath = (id: string) => `/api/patients/${encodeURIComponent(id)}`;

/** After a change: the patient's page shows the reply at once; lists and history refresh. */
function useSavedPatient() {
  const client = useQueryClient();
  return (patient: PatientDetail) => {
    client.setQueryData(patientKeys.detail(patient.id), patient);
    void client.invalidateQueries({ queryKey: patientKeys.all });
  };
}

export function useCreatePatient() {
  const saved = useSavedPatient();
  return useMutation({
    mutationFn: (body: CreatePatientBody) =>
      apiRequest('/api/patients', { method: 'POST', body, schema: PatientDetail }),
    onSuccess: saved,
  });
}

export function useUpdatePatient(patientId: string) {
  const saved = useSavedPatient();
  return useMutation({
    mutationFn: (body: UpdatePatientBody) =>
      apiRequest(patientPath(patientId), { method: 'PATCH', body, schema: PatientDetail }),
    onSuccess: saved,
  });
}

export function useArchivePatient(patientId: string) {
  const saved = useSavedPatient();
  return useMutation({
    mutationFn: ({ archived, body }: { archived: boolean; body: ArchivePatientBody }) =>
      apiRequest(`${patientPath(patientId)}/${archived ? 'archive' : 'unarchive'}`, {
        method: 'POST',
        body,
        schema: PatientDetail,
      }),
    onSuccess: saved,
  });
}

const versionsQueryOptions = (patientId: string) =>
  queryOptions({
    queryKey: patientKeys.versions(patientId),
    queryFn: ({ signal }) => apiRequest(`${patientPath(patientId)}/versions`, { schema: PatientVersionsReply, signal }),
  });
export const usePatientVersions = (patientId: string) => useQuery(versionsQueryOptions(patientId));

/** The practice's patients with this family name and birth date (asked only when both are complete). */
export function useDuplicates(familyName: string, birthDate: string, excludeId?: string) {
  const ready = familyName.trim().length > 0 && /^\d{4}-\d{2}-\d{2}$/.test(birthDate);
  return useQuery({
    queryKey: patientKeys.duplicates(familyName.trim(), birthDate, excludeId),
    queryFn: ({ signal }) => {
      const params = new URLSearchParams({ familyName: familyName.trim(), birthDate });
      if (excludeId) params.set('excludeId', excludeId);
      return apiRequest(`/api/patients/duplicates?${params}`, { schema: DuplicateCheckReply, signal });
    },
    enabled: ready,
  });
}

const settingsQueryOptions = () =>
  queryOptions({
    queryKey: patientKeys.settings(),
    queryFn: ({ signal }) => apiRequest('/api/practice/patient-settings', { schema: PatientSettingsReply, signal }),
  });
export const usePatientSettings = () => useQuery(settingsQueryOptions());

export function useUpdatePatientSettings() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: PatientSettingsBody) =>
      apiRequest('/api/practice/patient-settings', { method: 'PUT', body, schema: PatientSettingsReply }),
    onSuccess: (data) => client.setQueryData(patientKeys.settings(), data),
  });
}
