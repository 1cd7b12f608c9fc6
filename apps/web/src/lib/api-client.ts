import { ErrorReply } from '@torquetrail/contracts';
import type { z } from 'zod';
import { takeEarlyRead } from './early-reads/take';

/**
 * A failed API call. `status` is the HTTP status, or 0 when the server could not be reached
 * or its reply did not match the contract. `fields` maps a body path to its message (400s).
 */
export class ApiError extends Error {
  readonly status: number;
  readonly fields: Readonly<Record<string, string>>;

  constructor(status: number, message: string, fields: Record<string, string> = {}, options?: ErrorOptions) {
    super(message, options);
    this.name = 'ApiError';
    this.status = status;
    this.fields = fields;
  }
}

export function isApiError(error: unknown, status?: number): error is ApiError {
  return error instanceof ApiError && (status === undefined || error.status === status);
}

interface RequestOptions<S extends z.ZodType | undefined> {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  /** Sent as JSON. */
  body?: unknown;
  /** Validates the reply; without it the reply is returned as `unknown`. */
  schema?: S;
  signal?: AbortSignal;
}

type Reply<S> = S extends z.ZodType ? z.output<S> : unknown;

/**
 * The one fetch wrapper of the web: JSON in and out, the session cookie sent along, the reply
 * checked against its contract. It has no side effects: callers decide what a 401 means.
 */
export async function apiRequest<S extends z.ZodType | undefined = undefined>(
  path: string,
  options: RequestOptions<S> = {},
): Promise<Reply<S>> {
  const { method = 'GET', body, schema, signal } = options;
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';

  let response: Response;
  try {
    // A read index.html already started (early-reads/) is taken once instead of sent again.
    const early = method === 'GET' && body === undefined ? takeEarlyRead(path) : undefined;
    response = await (early ??
      fetch(path, {
        method,
        headers,
        body: body === undefined ? undefined : JSON.stringify(body),
        credentials: 'same-origin',
        signal,
      }));
  } catch (cause) {
    if (signal?.aborted) throw cause;
    throw new ApiError(0, 'Cannot reach the Torquetrail server. Check the connection and retry.');
  }

  const payload = await readJson(response);
  if (!response.ok) {
    const reply = ErrorReply.safeParse(payload);
    if (reply.success) throw new ApiError(response.status, reply.data.message, reply.data.fields);
    throw new ApiError(response.status, `The server answered ${response.status} ${response.statusText}`.trim());
  }
  if (!schema) return payload as Reply<S>;
  const parsed = schema.safeParse(payload);
  if (!parsed.success) {
    // A contract mismatch is a bug between API and web, not something the user can fix; the
    // issues travel as the error's cause for the developer tools.
    throw new ApiError(
      0,
      'The server sent a reply this version of Torquetrail does not understand. Reload the page.',
      {},
      { cause: { method, path, issues: parsed.error.issues } },
    );
  }
  return parsed.data as Reply<S>;
}

async function readJson(response: Response): Promise<unknown> {
  if (response.status === 204) return undefined;
  const text = await response.text();
  if (text === '') return undefined;
  try {
    return JSON.parse(text);
  } catch {
    return undefined;
  }
}
