// Fetchers, query options and hooks of Practice → People (one contract each, from @torquetrail/contracts).
import {
  type ChangeRoleBody,
  Invitation,
  type InviteBody,
  PeopleReply,
  Person,
  PracticeContact,
  type PracticeContactBody,
  SessionSettings,
} from '@torquetrail/contracts';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { peopleKeys } from './keys';

const peopleQueryOptions = () =>
  queryOptions({
    queryKey: peopleKeys.list(),
    queryFn: ({ signal }) => apiRequest('/api/people', { schema: PeopleReply, signal }),
    // While an invitation's e-mail is on its way, look again every few seconds for its link's expiry.
    refetchInterval: (query) =>
      query.state.data?.invitations.some((i) => i.status === 'pending' && !i.mailSentAt && !i.mailFailed)
        ? 3000
        : false,
  });
export const usePeople = () => useQuery(peopleQueryOptions());

/** Every change on the page reloads the list (roles, statuses and invitations move together). */
function usePeopleMutation<T, R>(mutationFn: (vars: T) => Promise<R>) {
  const client = useQueryClient();
  return useMutation({
    mutationFn,
    onSuccess: () => client.invalidateQueries({ queryKey: peopleKeys.list() }),
  });
}

export const useInvite = () =>
  usePeopleMutation((body: InviteBody) =>
    apiRequest('/api/people/invitations', { method: 'POST', body, schema: Invitation }),
  );

export const useResendInvitation = () =>
  usePeopleMutation((id: string) =>
    apiRequest(`/api/people/invitations/${encodeURIComponent(id)}/resend`, { method: 'POST', schema: Invitation }),
  );

export const useRevokeInvitation = () =>
  usePeopleMutation((id: string) =>
    apiRequest(`/api/people/invitations/${encodeURIComponent(id)}/revoke`, { method: 'POST', schema: Invitation }),
  );

export const useChangeRole = () =>
  usePeopleMutation(({ id, ...body }: ChangeRoleBody & { id: string }) =>
    apiRequest(`/api/people/${encodeURIComponent(id)}/role`, { method: 'PUT', body, schema: Person }),
  );

export const useDeactivate = () =>
  usePeopleMutation((id: string) =>
    apiRequest(`/api/people/${encodeURIComponent(id)}/deactivation`, { method: 'POST', schema: Person }),
  );

const sessionSettingsQueryOptions = () =>
  queryOptions({
    queryKey: peopleKeys.sessionSettings(),
    queryFn: ({ signal }) => apiRequest('/api/practice/session-settings', { schema: SessionSettings, signal }),
  });
export const useSessionSettings = () => useQuery(sessionSettingsQueryOptions());

export function useSaveSessionSettings() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: SessionSettings) =>
      apiRequest('/api/practice/session-settings', { method: 'PUT', body, schema: SessionSettings }),
    onSuccess: (settings) => client.setQueryData(peopleKeys.sessionSettings(), settings),
  });
}

const practiceContactQueryOptions = () =>
  queryOptions({
    queryKey: peopleKeys.practiceContact(),
    queryFn: ({ signal }) => apiRequest('/api/practice/contact', { schema: PracticeContact, signal }),
  });
export const usePracticeContact = () => useQuery(practiceContactQueryOptions());

export function useSavePracticeContact() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: PracticeContactBody) =>
      apiRequest('/api/practice/contact', { method: 'PUT', body, schema: PracticeContact }),
    onSuccess: (contact) => client.setQueryData(peopleKeys.practiceContact(), contact),
  });
}
