// Fetchers, query options and hooks of the shares (one contract each, from @torquetrail/contracts).
import { type CreateShareBody, type RevokeShareBody, Share, ShareListReply } from '@torquetrail/contracts';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { shareKeys } from './keys';

const practiceSharesQueryOptions = () =>
  queryOptions({
    queryKey: shareKeys.practice(),
    queryFn: ({ signal }) => apiRequest('/api/shares', { schema: ShareListReply, signal }),
  });
export const usePracticeShares = () => useQuery(practiceSharesQueryOptions());

const patientSharesQueryOptions = (patientId: string) =>
  queryOptions({
    queryKey: shareKeys.patient(patientId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/patients/${encodeURIComponent(patientId)}/shares`, { schema: ShareListReply, signal }),
  });
export const usePatientShares = (patientId: string) => useQuery(patientSharesQueryOptions(patientId));

/** Every share change reloads both lists (the patient's and the practice's). */
function useShareMutation<T, R>(mutationFn: (vars: T) => Promise<R>) {
  const client = useQueryClient();
  return useMutation({
    mutationFn,
    onSuccess: () => client.invalidateQueries({ queryKey: shareKeys.all }),
  });
}

export const useCreateShare = (patientId: string) =>
  useShareMutation((body: CreateShareBody) =>
    apiRequest(`/api/patients/${encodeURIComponent(patientId)}/shares`, { method: 'POST', body, schema: Share }),
  );

export const useRevokeShare = () =>
  useShareMutation(({ id, ...body }: RevokeShareBody & { id: string }) =>
    apiRequest(`/api/shares/${encodeURIComponent(id)}/revoke`, { method: 'POST', body, schema: Share }),
  );
