import { TorqueEvent, type TorqueBody } from '@torquetrail/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { siteKeys } from '../../site-file';

/** Logging torque changes the site's Stack (last torque, re-torque reminder) and its Timeline. */
export function useLogTorque(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: TorqueBody) => apiRequest('/api/torque-events', { method: 'POST', body, schema: TorqueEvent }),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: siteKeys.detail(siteId) }),
        queryClient.invalidateQueries({ queryKey: siteKeys.timeline(siteId) }),
      ]),
  });
}
