// Planner endpoints: one fetcher + queryOptions + hook each. Mutations invalidate exactly the
// queries whose data they change.
import {
  type LabPrescriptionBody,
  LabPrescriptionSummary,
  type DeliveryBody,
  type PlanAmendmentBody,
  type PlanBody,
  RestorableSitesReply,
  RestorationDetail,
  RestorationListReply,
} from '@torquetrail/contracts';
import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { patientKeys } from '../../patients';
import { siteKeys } from '../../site-file';
import { restorationKeys } from './keys';

export const useRestorableSites = (patientId: string) =>
  useQuery({
    queryKey: restorationKeys.restorableSites(patientId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/patients/${patientId}/restorable-sites`, { schema: RestorableSitesReply, signal }),
  });

export const useRestorations = (patientId: string) =>
  useQuery({
    queryKey: restorationKeys.list(patientId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/patients/${patientId}/restorations`, { schema: RestorationListReply, signal }),
  });

/** What a restoration's change touches: the patient's list, and the Stack, Timeline and Arch of its sites. */
function invalidateRestoration(queryClient: QueryClient, r: RestorationDetail, { sites }: { sites: boolean }) {
  const keys: (readonly unknown[])[] = [restorationKeys.list(r.patientId)];
  for (const s of r.sites) {
    keys.push(siteKeys.timeline(s.siteId));
    if (sites) keys.push(siteKeys.detail(s.siteId));
  }
  if (sites) keys.push(patientKeys.detail(r.patientId), restorationKeys.restorableSites(r.patientId));
  return Promise.all(keys.map((queryKey) => queryClient.invalidateQueries({ queryKey })));
}

export function useSavePlan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: PlanBody) =>
      apiRequest('/api/restorations', { method: 'POST', body, schema: RestorationDetail }),
    onSuccess: (r) => invalidateRestoration(queryClient, r, { sites: true }),
  });
}

export function useDeliver() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: { id: string; body: DeliveryBody }) =>
      apiRequest(`/api/restorations/${id}/delivery`, { method: 'POST', body, schema: RestorationDetail }),
    onSuccess: (r) => invalidateRestoration(queryClient, r, { sites: true }),
  });
}

export function useLabPrescription(restoration: RestorationDetail) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: LabPrescriptionBody) =>
      apiRequest(`/api/restorations/${restoration.id}/lab-prescriptions`, {
        method: 'POST',
        body,
        schema: LabPrescriptionSummary,
      }),
    onSuccess: () => invalidateRestoration(queryClient, restoration, { sites: false }),
  });
}

/** A new version of a planned restoration; the old one stays, marked as amended. */
export function useAmendPlan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: { id: string; body: PlanAmendmentBody }) =>
      apiRequest(`/api/restorations/${id}/amendments`, { method: 'POST', body, schema: RestorationDetail }),
    onSuccess: (r) => invalidateRestoration(queryClient, r, { sites: true }),
  });
}
