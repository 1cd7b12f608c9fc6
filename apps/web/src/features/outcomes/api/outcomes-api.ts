// Fetchers and hooks of the outcomes routes (one contract each, from @torquetrail/contracts).
import {
  LotLookupReply,
  type LotLookupQuery,
  type OutcomeGrouping,
  OutcomesReply,
  ReferralSummaryMail,
  ReferralSummaryState,
} from '@torquetrail/contracts';
import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { outcomesKeys } from './keys';

/** Implants listed per page of the outcomes view (the curves count them all). */
export const OUTCOMES_PAGE_SIZE = 50;

export const useOutcomes = (groupBy: OutcomeGrouping, page: number) =>
  useQuery({
    queryKey: outcomesKeys.report(groupBy, page),
    queryFn: ({ signal }) =>
      apiRequest(
        `/api/outcomes?${new URLSearchParams({ groupBy, page: String(page), pageSize: String(OUTCOMES_PAGE_SIZE) })}`,
        {
          schema: OutcomesReply,
          signal,
        },
      ),
    // The curves stay on screen while another page of the list loads; not across groupings, whose
    // curves would show under the other grouping's names.
    placeholderData: (previous) => (previous?.groupBy === groupBy ? keepPreviousData(previous) : undefined),
  });

/** `?by=…&q=…` for the table and the CSV link alike. */
export const lotSearch = (query: LotLookupQuery) => `?${new URLSearchParams(query).toString()}`;

export const useLotLookup = (query: LotLookupQuery | null) =>
  useQuery({
    queryKey: outcomesKeys.lots(query ?? { by: 'lot', q: '' }),
    queryFn: ({ signal }) => apiRequest(`/api/lot-lookup${lotSearch(query!)}`, { schema: LotLookupReply, signal }),
    enabled: query !== null,
    retry: false,
  });

export const useReferralSummary = (patientId: string) =>
  useQuery({
    queryKey: outcomesKeys.referral(patientId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/patients/${encodeURIComponent(patientId)}/referral-summary`, {
        schema: ReferralSummaryState,
        signal,
      }),
    // A mail waiting for SMTP: look again until the job queue has sent it.
    refetchInterval: (q) => (q.state.data?.mails.some((m) => m.status === 'pending') ? 2000 : false),
  });

/** E-mails the summary; the caller keeps one idempotency key per press, so a double click sends once. */
export const useSendReferralSummary = (patientId: string) => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: { shareId: string; idempotencyKey: string }) =>
      apiRequest(`/api/patients/${encodeURIComponent(patientId)}/referral-summary/mails`, {
        method: 'POST',
        body,
        schema: ReferralSummaryMail,
      }),
    onSettled: () => client.invalidateQueries({ queryKey: outcomesKeys.referral(patientId) }),
  });
};
