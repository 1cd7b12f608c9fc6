// Seating checks of a restoration: read them for the "Confirm seating" form, record one, amend one.
import { SeatingAmendmentBody, SeatingCheck, SeatingCheckBody, SeatingCheckListReply } from '@torquetrail/contracts';
import type { z } from 'zod';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { siteKeys } from '../../site-file';

/** Under `siteKeys.all`: a change that refreshes every site's data refreshes these too. */
const seatingKeys = {
  ofRestoration: (restorationId: string) => [...siteKeys.all, 'seating-checks', restorationId] as const,
};

export const useSeatingChecks = (restorationId: string) =>
  useQuery({
    queryKey: seatingKeys.ofRestoration(restorationId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/restorations/${restorationId}/seating-checks`, { schema: SeatingCheckListReply, signal }),
  });

/** A body as the contract parsed it in the form. */
export type SeatingSave =
  | { amendId: null; body: z.output<typeof SeatingCheckBody> }
  | { amendId: string; body: z.output<typeof SeatingAmendmentBody> };

/**
 * Records a first check or amends the current one. Every site of the restoration shows it in its
 * Stack and Timeline, so all per-site data is refreshed.
 */
export function useSaveSeating(restorationId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (save: SeatingSave) =>
      save.amendId === null
        ? apiRequest(`/api/restorations/${restorationId}/seating-checks`, {
            method: 'POST',
            body: save.body,
            schema: SeatingCheck,
          })
        : apiRequest(`/api/seating-checks/${save.amendId}/amendments`, {
            method: 'POST',
            body: save.body,
            schema: SeatingCheck,
          }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: siteKeys.all }),
  });
}
