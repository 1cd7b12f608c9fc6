import { useQuery } from '@tanstack/react-query';
import { ErrorReply, ImportProgress, ImportReport, ImportResult, type ImportPartMapping } from '@torquetrail/contracts';
import { ApiError, apiRequest } from '../../../lib/api-client';
import { importKeys } from './keys';

/** How often the page asks how far a run has come. */
const PROGRESS_POLL_MS = 500;

interface SendOptions {
  runId: string;
  mappings: ImportPartMapping[];
}

/** Sends the file itself (application/octet-stream) with the run id and the part mappings. */
async function sendFile(path: string, file: File, { runId, mappings }: SendOptions): Promise<unknown> {
  const query = new URLSearchParams({ fileName: file.name, runId, mappings: JSON.stringify(mappings) });
  let response: Response;
  try {
    response = await fetch(`${path}?${query.toString()}`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/octet-stream', Accept: 'application/json' },
      body: file,
      credentials: 'same-origin',
    });
  } catch {
    throw new ApiError(0, 'Cannot reach the Torquetrail server. Check the connection and retry.');
  }
  const payload: unknown = await response.json().catch(() => null);
  if (!response.ok) {
    const error = ErrorReply.safeParse(payload);
    throw new ApiError(response.status, error.success ? error.data.message : `The server answered ${response.status}`);
  }
  return payload;
}

const parsed = <T>(schema: { safeParse: (v: unknown) => { success: boolean; data?: T } }, payload: unknown): T => {
  const result = schema.safeParse(payload);
  if (!result.success || result.data === undefined)
    throw new ApiError(0, 'The server sent a reply this version of Torquetrail does not understand. Reload the page.');
  return result.data;
};

export const dryRunImport = async (file: File, options: SendOptions) =>
  parsed<ImportReport>(ImportReport, await sendFile('/api/imports/dry-run', file, options));

export const runImport = async (file: File, options: SendOptions) =>
  parsed<ImportResult>(ImportResult, await sendFile('/api/imports', file, options));

/** The progress of a run while it is going (null: not started, or finished). */
export const useImportProgress = (runId: string | null) =>
  useQuery({
    queryKey: importKeys.progress(runId ?? 'none'),
    queryFn: ({ signal }) => apiRequest(`/api/imports/progress/${runId}`, { schema: ImportProgress, signal }),
    enabled: runId !== null,
    refetchInterval: PROGRESS_POLL_MS,
    retry: false,
  });
