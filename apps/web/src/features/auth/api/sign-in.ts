import { Me, type SignInBody } from '@torquetrail/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { removeAllButMe } from './get-me';
import { authKeys } from './keys';

function signIn(body: SignInBody): Promise<Me> {
  return apiRequest('/api/auth/sign-in', { method: 'POST', body, schema: Me });
}

/** Signing in replaces the `me` query; anything cached for a previous user is dropped. */
export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: authKeys.signIn,
    mutationFn: signIn,
    onSuccess: (me) => {
      removeAllButMe(queryClient);
      queryClient.setQueryData(authKeys.me, me);
    },
  });
}
