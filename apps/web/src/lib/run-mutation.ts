/**
 * Runs a mutation, then the caller's follow-up — even when the calling component unmounted meanwhile.
 *
 * Why not `runMutation(mutation, variables, { onSuccess })`: TanStack Query drops those per-call callbacks
 * once the component that called `mutate` unmounts, and a save's own refetch often unmounts it (a
 * delivered restoration no longer renders its delivery form; a saved plan's refreshed list replaces
 * the planner). The follow-up — open the seating form, navigate, show the server's field errors —
 * was then lost, at random, depending on which reply came first. `mutateAsync` settles regardless.
 * `lib/run-mutation.test.ts` forbids per-call callbacks on `mutate` anywhere in the web sources.
 */
export interface MutationFollowUps<TData> {
  onSuccess?: (data: TData) => unknown;
  onError?: (error: Error) => unknown;
  onSettled?: () => unknown;
}

/** The one part of a `useMutation` result this needs (its hook-level callbacks still run first). */
interface AsyncMutation<TData, TVariables> {
  mutateAsync: (variables: TVariables) => Promise<TData>;
}

export function runMutation<TData, TVariables>(
  mutation: AsyncMutation<TData, TVariables>,
  variables: TVariables,
  followUps: MutationFollowUps<TData> = {},
): void {
  void mutation
    .mutateAsync(variables)
    .then(
      (data) => {
        followUps.onSuccess?.(data);
      },
      // The mutation's own state (isError, error) carries the failure too; nothing is swallowed
      // that the page does not already show.
      (error: unknown) => {
        followUps.onError?.(error instanceof Error ? error : new Error(String(error)));
      },
    )
    .finally(() => followUps.onSettled?.());
}
