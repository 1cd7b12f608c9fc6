// An upload of one file as application/octet-stream through XMLHttpRequest, not fetch: only XHR
// reports upload progress in every browser, and it can be cancelled mid-file.
import { ErrorReply } from '@torquetrail/contracts';
import type { z } from 'zod';
import { ApiError } from './api-client';

export interface UploadHandle<T> {
  done: Promise<T>;
  cancel: () => void;
}

/** POSTs the file to `url`; `onProgress` gets bytes sent and total; resolves with the 201 reply. */
export function uploadFile<S extends z.ZodType>(
  url: string,
  file: File,
  schema: S,
  onProgress: (loaded: number, total: number) => void,
): UploadHandle<z.output<S>> {
  const xhr = new XMLHttpRequest();
  const done = new Promise<z.output<S>>((resolve, reject) => {
    xhr.open('POST', url);
    xhr.setRequestHeader('Content-Type', 'application/octet-stream');
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.responseType = 'text';
    xhr.upload.addEventListener('progress', (e) => onProgress(e.loaded, e.lengthComputable ? e.total : file.size));
    xhr.addEventListener('load', () => {
      let body: unknown = null;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        // not JSON: handled below as a failed reply
      }
      if (xhr.status === 201) {
        const parsed = schema.safeParse(body);
        if (parsed.success) return resolve(parsed.data);
      }
      const error = ErrorReply.safeParse(body);
      reject(new ApiError(xhr.status, error.success ? error.data.message : `The upload failed (${xhr.status})`));
    });
    xhr.addEventListener('error', () =>
      reject(new ApiError(0, 'Cannot reach the Torquetrail server. Check the connection and retry.')),
    );
    xhr.addEventListener('abort', () => reject(new ApiError(0, 'Upload cancelled')));
    xhr.send(file);
  });
  return { done, cancel: () => xhr.abort() };
}
