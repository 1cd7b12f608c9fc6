import {
  Complication,
  type ComplicationAmendmentBody,
  type TorqueAmendmentBody,
  TorqueEvent,
} from '@torquetrail/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { siteKeys } from '../../site-file';

/** An amendment is a new version: the Timeline changes, and for torque the Stack's last torque too. */
export function useAmendTorque(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: { id: string; body: TorqueAmendmentBody }) =>
      apiRequest(`/api/torque-events/${id}/amendments`, { method: 'POST', body, schema: TorqueEvent }),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: siteKeys.timeline(siteId) }),
        queryClient.invalidateQueries({ queryKey: siteKeys.detail(siteId) }),
      ]),
  });
}

export function useAmendComplication(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: { id: string; body: ComplicationAmendmentBody }) =>
      apiRequest(`/api/complications/${id}/amendments`, { method: 'POST', body, schema: Complication }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: siteKeys.timeline(siteId) }),
  });
}
