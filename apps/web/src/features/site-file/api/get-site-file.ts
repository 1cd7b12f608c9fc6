import { SiteFile } from '@torquetrail/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { siteKeys } from './keys';

function fetchSiteFile(siteId: string, signal?: AbortSignal): Promise<SiteFile> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}`, { schema: SiteFile, signal });
}

const siteFileQueryOptions = (siteId: string) =>
  queryOptions({
    queryKey: siteKeys.detail(siteId),
    queryFn: ({ signal }) => fetchSiteFile(siteId, signal),
  });

export function useSiteFile(siteId: string) {
  return useQuery(siteFileQueryOptions(siteId));
}
