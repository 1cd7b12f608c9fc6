// Fetchers and hooks of the passport e-mail routes (the downloads are plain links).
import { PassportMail, RecordsOutStatus } from '@torquetrail/contracts';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { recordsOutKeys } from './keys';

const base = (patientId: string) => `/api/patients/${encodeURIComponent(patientId)}`;

export const recordsOutLinks = (patientId: string) => ({
  fhir: `${base(patientId)}/fhir`,
  passport: `${base(patientId)}/passport.pdf`,
  retrievalCard: `${base(patientId)}/retrieval-card.pdf`,
});

/** Whether the passport may be e-mailed, and the latest requests (polled while one waits for SMTP). */
export const usePassportMails = (patientId: string) =>
  useQuery({
    queryKey: recordsOutKeys.mails(patientId),
    queryFn: ({ signal }) => apiRequest(`${base(patientId)}/passport/mails`, { schema: RecordsOutStatus, signal }),
    refetchInterval: (query) => (query.state.data?.mails.some((m) => m.status === 'pending') ? 2_000 : false),
  });

export function useMailPassport(patientId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () =>
      apiRequest(`${base(patientId)}/passport/mails`, { method: 'POST', body: {}, schema: PassportMail }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: recordsOutKeys.mails(patientId) }),
  });
}
