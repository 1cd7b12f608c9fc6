import { Complication, type ComplicationBody } from '@torquetrail/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { siteKeys } from '../../site-file';

/** A complication appears in the site's Timeline only; the Stack does not change. */
export function useRecordComplication(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ComplicationBody) =>
      apiRequest('/api/complications', { method: 'POST', body, schema: Complication }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: siteKeys.timeline(siteId) }),
  });
}
