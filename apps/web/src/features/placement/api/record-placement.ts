import { type PlacementBody, PlacementRecord } from '@torquetrail/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { patientKeys } from '../../patients';
import { siteKeys } from '../../site-file';

/** A placement changes the Site file (header, Stack), its Timeline and the patient's Arch (status, system). */
export function useRecordPlacement(patientId: string, siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: PlacementBody) =>
      apiRequest(`/api/sites/${encodeURIComponent(siteId)}/placements`, {
        method: 'POST',
        body,
        schema: PlacementRecord,
      }),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: siteKeys.detail(siteId) }),
        queryClient.invalidateQueries({ queryKey: siteKeys.timeline(siteId) }),
        queryClient.invalidateQueries({ queryKey: patientKeys.detail(patientId) }),
      ]),
  });
}
