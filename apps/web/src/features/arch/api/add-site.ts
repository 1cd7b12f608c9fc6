import { ArchSite, type AddSiteBody } from '@torquetrail/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { patientKeys } from '../../patients';

/** A planned site appears on the Arch: the patient query is read again. */
export function useAddSite(patientId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: AddSiteBody) =>
      apiRequest(`/api/patients/${encodeURIComponent(patientId)}/sites`, { method: 'POST', body, schema: ArchSite }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: patientKeys.detail(patientId) }),
  });
}
