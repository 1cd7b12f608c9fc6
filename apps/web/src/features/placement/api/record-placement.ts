import { type PlacementBody, PlacementRecord } from '@torquetrail/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { patientQueryKey } from '../../../lib/api/get-patient';

/** A placement changes the Site file (header, Stack), its Timeline and the patient's Arch (status, system). */
export function useRecordPlacement(patientId: string, siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: PlacementBody) => apiRequest(`/api/sites/${encodeURIComponent(siteId)}/placements`, { method: 'POST', body, schema: PlacementRecord }),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: ['sites', 'detail', siteId] }),
        queryClient.invalidateQueries({ queryKey: ['sites', 'timeline', siteId] }),
        queryClient.invalidateQueries({ queryKey: patientQueryKey(patientId) }),
      ]),
  });
}
