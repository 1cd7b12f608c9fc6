// Query and mutation keys of the auth feature.
export const authKeys = {
  /** The signed-in user (`null` when signed out); the app's query cache watches it (app/query-client.ts). */
  me: ['auth', 'me'] as const,
  signIn: ['auth', 'sign-in'] as const,
  signOut: ['auth', 'sign-out'] as const,
  invitation: (token: string) => ['auth', 'invitation', token] as const,
  passwordReset: (token: string) => ['auth', 'password-reset', token] as const,
};

/** Whether a query key is the `me` query's (or below it). */
export const isMeQueryKey = (key: readonly unknown[]): boolean => authKeys.me.every((part, i) => key[i] === part);
