// The practice's cantilever limit: read by the planner (its live Findings), set by the admin.
import { CantileverSettings } from '@torquetrail/contracts';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { catalogueKeys } from './keys';

export const useCantileverSettings = () =>
  useQuery({
    queryKey: catalogueKeys.cantileverSettings(),
    queryFn: ({ signal }) => apiRequest('/api/practice/cantilever-settings', { schema: CantileverSettings, signal }),
  });

/** Admin: plans saved from now on are judged against the new ratio; saved plans keep their Findings. */
export function useSaveCantileverSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CantileverSettings) =>
      apiRequest('/api/practice/cantilever-settings', { method: 'PUT', body, schema: CantileverSettings }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKeys.cantileverSettings() }),
  });
}
