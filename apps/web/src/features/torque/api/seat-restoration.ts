import { RestorationScrewsReply, type SeatRestorationBody, SeatRestorationReply } from '@torquetrail/contracts';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { siteKeys } from '../../site-file';
import { screwKeys } from './keys';

const screwsQueryOptions = (restorationId: string) =>
  queryOptions({
    queryKey: screwKeys.of(restorationId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/restorations/${restorationId}/screws`, { schema: RestorationScrewsReply, signal }),
  });

/** The torqued parts of a delivered restoration, each with its spec and whether it was seated. */
export function useRestorationScrews(restorationId: string) {
  return useQuery(screwsQueryOptions(restorationId));
}

/** Seating every screw at once changes each site's Stack and Timeline, and the screws' seating. */
export function useSeatRestoration(restorationId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: SeatRestorationBody) =>
      apiRequest(`/api/restorations/${restorationId}/seat`, { method: 'POST', body, schema: SeatRestorationReply }),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: screwKeys.of(restorationId) }),
        queryClient.invalidateQueries({ queryKey: siteKeys.all }),
      ]),
  });
}
