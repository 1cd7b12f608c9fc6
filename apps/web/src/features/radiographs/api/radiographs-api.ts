// Radiograph endpoints. The upload goes through lib/upload-file (XHR: progress and cancel).
import {
  type EnteredInErrorBody,
  Measurement,
  type MeasurementAmendmentBody,
  type MeasurementBody,
  Radiograph,
  RadiographDetail,
  RadiographListReply,
  type RadiographUploadQuery,
} from '@torquetrail/contracts';
import type { z } from 'zod';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { type UploadHandle as LibUploadHandle, uploadFile } from '../../../lib/upload-file';
import { recallKeys } from '../../recalls';
import { radiographKeys } from './keys';

/** How often a radiograph whose preview is being prepared is asked for again, ms. */
const PREVIEW_POLL_MS = 2000;

export const useRadiographs = (patientId: string, includeEnteredInError = false) =>
  useQuery({
    queryKey: radiographKeys.list(patientId, includeEnteredInError),
    queryFn: ({ signal }) =>
      apiRequest(`/api/patients/${patientId}/radiographs?includeEnteredInError=${String(includeEnteredInError)}`, {
        schema: RadiographListReply,
        signal,
      }),
    // Previews are made after the upload: the list is fetched again until none is pending.
    refetchInterval: (query) =>
      query.state.data?.items.some((r) => r.previewStatus === 'pending') ? PREVIEW_POLL_MS : false,
  });

/** The upload's details as the contract parses them. */
export type UploadDetails = z.output<typeof RadiographUploadQuery>;

export type UploadHandle = LibUploadHandle<Radiograph>;

/** Streams one file to the API as application/octet-stream; `onProgress` gets bytes sent and total. */
export function uploadRadiograph(
  patientId: string,
  file: File,
  query: UploadDetails,
  onProgress: (loaded: number, total: number) => void,
): UploadHandle {
  const params = new URLSearchParams({ fileName: file.name, kind: query.kind });
  if (query.takenOn) params.set('takenOn', query.takenOn);
  if (query.note) params.set('note', query.note);
  if (query.siteIds.length > 0) params.set('siteIds', query.siteIds.join(','));
  return uploadFile(`/api/patients/${patientId}/radiographs?${params.toString()}`, file, Radiograph, onProgress);
}

export const useRadiograph = (radiographId: string) =>
  useQuery({
    queryKey: radiographKeys.detail(radiographId),
    queryFn: ({ signal }) => apiRequest(`/api/radiographs/${radiographId}`, { schema: RadiographDetail, signal }),
    refetchInterval: (query) => (query.state.data?.previewStatus === 'pending' ? PREVIEW_POLL_MS : false),
  });

/**
 * A measurement or a radiograph marked entered in error changes lists, details and bone-level
 * charts, and the bone level the recall exam form offers (its context would otherwise be kept
 * for the app's 30 s stale time).
 */
function invalidateMeasured(queryClient: ReturnType<typeof useQueryClient>) {
  return Promise.all([
    queryClient.invalidateQueries({ queryKey: radiographKeys.all }),
    queryClient.invalidateQueries({ queryKey: recallKeys.examContexts() }),
  ]);
}

export function useMeasure(radiographId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: MeasurementBody) =>
      apiRequest(`/api/radiographs/${radiographId}/measurements`, { method: 'POST', body, schema: Measurement }),
    onSuccess: () => invalidateMeasured(queryClient),
  });
}

export function useAmendMeasurement() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ measurementId, body }: { measurementId: string; body: MeasurementAmendmentBody }) =>
      apiRequest(`/api/radiograph-measurements/${measurementId}/amendments`, {
        method: 'POST',
        body,
        schema: Measurement,
      }),
    onSuccess: () => invalidateMeasured(queryClient),
  });
}

export function useMarkEnteredInError(radiographId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: EnteredInErrorBody) =>
      apiRequest(`/api/radiographs/${radiographId}/entered-in-error`, { method: 'POST', body, schema: Radiograph }),
    onSuccess: () => invalidateMeasured(queryClient),
  });
}
