// The account's own routes: invitation and reset links (public pages) and changing one's password.
import {
  type AcceptInvitationBody,
  type ChangePasswordBody,
  type CompletePasswordResetBody,
  InvitationPreview,
  PasswordResetPreview,
  type PasswordResetRequestBody,
  PasswordResetRequestReply,
} from '@torquetrail/contracts';
import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { authKeys } from './keys';

// A link is looked up once: a refusal (used, expired) will not change by asking again.
const invitationQueryOptions = (token: string) =>
  queryOptions({
    queryKey: authKeys.invitation(token),
    queryFn: ({ signal }) =>
      apiRequest('/api/account/invitation', { method: 'POST', body: { token }, schema: InvitationPreview, signal }),
    retry: false,
    staleTime: Infinity,
  });
export const useInvitationPreview = (token: string) => useQuery(invitationQueryOptions(token));

export const useAcceptInvitation = () =>
  useMutation({
    mutationFn: (body: AcceptInvitationBody) => apiRequest('/api/account/invitation/accept', { method: 'POST', body }),
  });

export const useRequestReset = () =>
  useMutation({
    mutationFn: (body: PasswordResetRequestBody) =>
      apiRequest('/api/account/password-reset', { method: 'POST', body, schema: PasswordResetRequestReply }),
  });

const resetQueryOptions = (token: string) =>
  queryOptions({
    queryKey: authKeys.passwordReset(token),
    queryFn: ({ signal }) =>
      apiRequest('/api/account/password-reset/look-up', {
        method: 'POST',
        body: { token },
        schema: PasswordResetPreview,
        signal,
      }),
    retry: false,
    staleTime: Infinity,
  });
export const useResetPreview = (token: string) => useQuery(resetQueryOptions(token));

export const useCompleteReset = () =>
  useMutation({
    mutationFn: (body: CompletePasswordResetBody) =>
      apiRequest('/api/account/password-reset/complete', { method: 'POST', body }),
  });

export const useChangePassword = () =>
  useMutation({
    mutationFn: (body: ChangePasswordBody) => apiRequest('/api/auth/password', { method: 'PUT', body }),
  });
