import { PlacementOptionsReply } from '@torquetrail/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { siteKeys } from '../../site-file';

function fetchPlacementOptions(siteId: string, signal?: AbortSignal): Promise<PlacementOptionsReply> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/placement-options`, {
    schema: PlacementOptionsReply,
    signal,
  });
}

const placementOptionsQueryOptions = (siteId: string) =>
  queryOptions({
    queryKey: siteKeys.placementOptions(siteId),
    queryFn: ({ signal }) => fetchPlacementOptions(siteId, signal),
  });

/** The systems of the site's practice (a shared surgeon may not read that practice's catalogue). */
export function usePlacementOptions(siteId: string) {
  return useQuery(placementOptionsQueryOptions(siteId));
}
