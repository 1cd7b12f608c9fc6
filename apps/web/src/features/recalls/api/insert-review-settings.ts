// The practice's insert review interval: read by everyone at the desk, set by the admin.
import { InsertReviewSettings } from '@torquetrail/contracts';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { recallKeys } from './keys';

export const useInsertReviewSettings = () =>
  useQuery({
    queryKey: recallKeys.insertReview(),
    queryFn: ({ signal }) =>
      apiRequest('/api/practice/insert-review-settings', { schema: InsertReviewSettings, signal }),
  });

/** Admin: the desk's insert review list (and every Site file's due day) follows the new interval at once. */
export function useSaveInsertReviewSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: InsertReviewSettings) =>
      apiRequest('/api/practice/insert-review-settings', { method: 'PUT', body, schema: InsertReviewSettings }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: recallKeys.all }),
  });
}
