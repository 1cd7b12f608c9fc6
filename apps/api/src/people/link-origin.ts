import type { Request } from 'express';
import type { Env } from '../config/env.js';

/**
 * The web app's address for a mailed link: APP_URL (required in production), else the address the
 * request came to (development and tests, where the app listens on whatever port it was given).
 */
export const linkOrigin = (env: Env, req: Request): string =>
  (env.APP_URL ?? `${req.protocol}://${req.get('host') ?? 'localhost'}`).replace(/\/+$/, '');
