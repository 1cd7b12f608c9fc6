// A site's measured bone levels with the criteria of the series (GET /sites/:id/bone-levels).
import { SiteBoneLevels } from '@torquetrail/contracts';
import { useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { radiographKeys } from './keys';

export const useSiteBoneLevels = (siteId: string) =>
  useQuery({
    queryKey: radiographKeys.boneLevels(siteId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/sites/${encodeURIComponent(siteId)}/bone-levels`, { schema: SiteBoneLevels, signal }),
  });
