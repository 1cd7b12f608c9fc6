import {
  CatalogueComponent,
  CataloguePlatform,
  CatalogueReply,
  CatalogueSystem,
  type ComponentBody,
  type ComponentPatch,
  ComponentVersionsReply,
  type PlatformBody,
  type SystemBody,
  type SystemPatch,
} from '@torquetrail/contracts';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { catalogueKeys } from './keys';

const catalogueQueryOptions = () =>
  queryOptions({
    queryKey: catalogueKeys.all,
    queryFn: ({ signal }) => apiRequest('/api/catalogue', { schema: CatalogueReply, signal }),
  });
export const useCatalogue = () => useQuery(catalogueQueryOptions());

/** Admin: add a part or edit one (an edit saves a new version); only the catalogue changes. */
export function useSaveComponent() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: { id?: string; body: ComponentBody | ComponentPatch }) =>
      apiRequest(id ? `/api/catalogue/components/${id}` : '/api/catalogue/components', {
        method: id ? 'PATCH' : 'POST',
        body,
        schema: CatalogueComponent,
      }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKeys.all }),
  });
}

/** Admin: add an implant system or a platform to one; only the catalogue changes. */
export function useAddSystem() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: SystemBody) =>
      apiRequest('/api/catalogue/systems', { method: 'POST', body, schema: CatalogueSystem }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKeys.all }),
  });
}
/** Gives a system a GTIN (one known for another system moves); only the catalogue changes. */
export function useEnterSystemGtin() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, gtin }: { id: string; gtin: string }) =>
      apiRequest(`/api/catalogue/systems/${id}`, {
        method: 'PATCH',
        body: { gtins: [gtin] } satisfies SystemPatch,
        schema: CatalogueSystem,
      }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKeys.all }),
  });
}
export function useAddPlatform() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: PlatformBody) =>
      apiRequest('/api/catalogue/platforms', { method: 'POST', body, schema: CataloguePlatform }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: catalogueKeys.all }),
  });
}

/** Every version of a part, oldest first (records keep the version they used). */
export function useComponentVersions(id: string, enabled: boolean) {
  return useQuery({
    queryKey: catalogueKeys.versions(id),
    queryFn: ({ signal }) =>
      apiRequest(`/api/catalogue/components/${id}/versions`, { schema: ComponentVersionsReply, signal }),
    enabled,
  });
}
