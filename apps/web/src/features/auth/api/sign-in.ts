import { Me, type SignInBody } from '@torquetrail/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { meQueryKey, removeAllButMe } from './get-me';

export function signIn(body: SignInBody): Promise<Me> {
  return apiRequest('/api/auth/sign-in', { method: 'POST', body, schema: Me });
}

/** Signing in replaces the `me` query; anything cached for a previous user is dropped. */
export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: ['auth', 'sign-in'],
    mutationFn: signIn,
    onSuccess: (me) => {
      removeAllButMe(queryClient);
      queryClient.setQueryData(meQueryKey, me);
    },
  });
}
