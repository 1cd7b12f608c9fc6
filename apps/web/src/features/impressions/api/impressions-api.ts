// Impression endpoints: the restoration's impression with its scan files, a scan file's upload
// (lib/upload-file: progress and cancel) and its bytes for the 3D preview.
import {
  Impression,
  type ImpressionBody,
  ImpressionListReply,
  ImpressionSettings,
  ScanBodyMarker,
  type ScanBodyMarkerBody,
  ScanBodyMarkerListReply,
  ScanFile,
} from '@torquetrail/contracts';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { ApiError, apiRequest } from '../../../lib/api-client';
import { uploadFile } from '../../../lib/upload-file';
import { impressionKeys } from './keys';

export const useImpressions = (restorationId: string) =>
  useQuery({
    queryKey: impressionKeys.ofRestoration(restorationId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/restorations/${restorationId}/impressions`, { schema: ImpressionListReply, signal }),
  });

/** Record the restoration's first impression (analog, or digital with a scan body per site). */
export function useRecordImpression(restorationId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ImpressionBody) =>
      apiRequest(`/api/restorations/${restorationId}/impressions`, { method: 'POST', body, schema: Impression }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: impressionKeys.ofRestoration(restorationId) }),
  });
}

export const useImpressionSettings = () =>
  useQuery({
    queryKey: impressionKeys.settings,
    queryFn: ({ signal }) => apiRequest('/api/practice/impression-settings', { schema: ImpressionSettings, signal }),
  });

/** Admin: whether a digital impression asks for a radiograph of the seated scan bodies. */
export function useSaveImpressionSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ImpressionSettings) =>
      apiRequest('/api/practice/impression-settings', { method: 'PUT', body, schema: ImpressionSettings }),
    onSuccess: async (saved) => {
      queryClient.setQueryData(impressionKeys.settings, saved);
      await queryClient.invalidateQueries({ queryKey: impressionKeys.all });
    },
  });
}

export const uploadScanFile = (impressionId: string, file: File, onProgress: (loaded: number) => void) =>
  uploadFile(
    `/api/impressions/${impressionId}/scan-files?${new URLSearchParams({ fileName: file.name }).toString()}`,
    file,
    ScanFile,
    onProgress,
  );

/** The stored file's bytes, for three's loaders. */
export async function fetchScanFile(scanFileId: string, signal?: AbortSignal): Promise<ArrayBuffer> {
  const res = await fetch(`/api/scan-files/${scanFileId}/file`, { signal, credentials: 'same-origin' });
  if (!res.ok) throw new ApiError(res.status, 'The scan file could not be loaded');
  return res.arrayBuffer();
}

/** The scan bodies marked on a scan file (the current point of each). */
export const useScanBodyMarkers = (scanFileId: string) =>
  useQuery({
    queryKey: impressionKeys.markers(scanFileId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/scan-files/${scanFileId}/markers`, { schema: ScanBodyMarkerListReply, signal }),
  });

/**
 * Save the markers changed in the preview, one request per scan body (each is its own audited
 * version), in order; the list is read again afterwards, whatever happened.
 */
export function useSaveScanBodyMarkers(scanFileId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (changes: ScanBodyMarkerBody[]) => {
      for (const body of changes)
        await apiRequest(`/api/scan-files/${scanFileId}/markers`, { method: 'POST', body, schema: ScanBodyMarker });
    },
    onSettled: () => queryClient.invalidateQueries({ queryKey: impressionKeys.markers(scanFileId) }),
  });
}
