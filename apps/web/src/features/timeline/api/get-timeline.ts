import { TimelineReply } from '@torquetrail/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { siteKeys } from '../../site-file';

/** The whole Timeline is fetched once; filtering by kind happens on the page (years of a site fit easily). */
const timelineQueryOptions = (siteId: string) =>
  queryOptions({
    queryKey: siteKeys.timeline(siteId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/sites/${encodeURIComponent(siteId)}/timeline`, { schema: TimelineReply, signal }),
  });

export function useTimeline(siteId: string) {
  return useQuery(timelineQueryOptions(siteId));
}
