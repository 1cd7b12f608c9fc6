import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest, isApiError } from '../../../lib/api-client';
import { removeAllButMe } from './get-me';
import { authKeys } from './keys';

/** Ends the session. A 401 means it had already ended, which is what we wanted. */
async function signOut(): Promise<void> {
  try {
    await apiRequest('/api/auth/sign-out', { method: 'POST' });
  } catch (error) {
    if (!isApiError(error, 401)) throw error;
  }
}

/** Signs out, then clears every cached reply and sets `me` to signed-out. */
export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: authKeys.signOut,
    mutationFn: signOut,
    onSuccess: () => {
      removeAllButMe(queryClient);
      queryClient.setQueryData(authKeys.me, null);
    },
  });
}
