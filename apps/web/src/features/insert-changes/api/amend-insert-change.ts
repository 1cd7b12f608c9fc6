import { InsertChange, type InsertChangeAmendmentBody } from '@torquetrail/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { siteKeys } from '../../site-file';
import { recallKeys } from '../../recalls';

/**
 * An amended change moves what a logged one does: the Site file (its Stack and counts), the
 * Timeline and the desk's insert reviews.
 */
export function useAmendInsertChange(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: { id: string; body: InsertChangeAmendmentBody }) =>
      apiRequest(`/api/insert-changes/${id}/amendments`, { method: 'POST', body, schema: InsertChange }),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: siteKeys.detail(siteId) }),
        queryClient.invalidateQueries({ queryKey: siteKeys.timeline(siteId) }),
        queryClient.invalidateQueries({ queryKey: recallKeys.all }),
      ]),
  });
}
