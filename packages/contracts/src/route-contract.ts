import type { z } from 'zod';

export interface RouteContract {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  /** Path under /api, with :params. */
  path: string;
  summary: string;
  /** false for the few public routes. */
  signedIn: boolean;
  body?: z.ZodType;
  query?: z.ZodType;
  reply?: z.ZodType;
  /** Status of a success without a body. */
  noContent?: boolean;
  /** Success status when it is not the usual one (201 for POST, 200 otherwise). */
  status?: 200 | 201;
  /** A reply that is not JSON (e.g. application/pdf, text/csv). */
  produces?: string;
}
