import { InsertChange, type InsertChangeBody } from '@torquetrail/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { siteKeys } from '../../site-file';
import { recallKeys } from '../../recalls';

/** A logged change moves the Site file's interval and counts, the Timeline and the desk's insert reviews. */
export function useLogInsertChange(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: InsertChangeBody) =>
      apiRequest('/api/insert-changes', { method: 'POST', body, schema: InsertChange }),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: siteKeys.detail(siteId) }),
        queryClient.invalidateQueries({ queryKey: siteKeys.timeline(siteId) }),
        queryClient.invalidateQueries({ queryKey: recallKeys.all }),
      ]),
  });
}
