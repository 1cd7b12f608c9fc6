import type { NextFunction, Request, Response } from 'express';
import type { ErrorReply } from '@torquetrail/contracts';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

const originOf = (url: string | undefined): string | undefined => {
  if (url === undefined) return undefined;
  try {
    return new URL(url).origin;
  } catch {
    return 'invalid';
  }
};

/**
 * The routes whose body is not JSON: a radiograph or scan file upload streams the file's bytes, and a legacy
 * import (and its dry run) sends the CSV file. Only application/octet-stream is accepted there,
 * which a cross-site HTML form cannot send either (forms send urlencoded, multipart or
 * text/plain), and the Origin check above still applies.
 */
const BINARY_UPLOAD =
  /^\/api\/(patients\/[^/]+\/radiographs|impressions\/[^/]+\/scan-files|imports|imports\/dry-run)\/?$/;
const isBinaryUpload = (req: Request) =>
  req.method === 'POST' &&
  BINARY_UPLOAD.test(req.path) &&
  req.is('application/octet-stream') === 'application/octet-stream';

const refuse = (res: Response, statusCode: 403 | 415, error: string, message: string) =>
  res.status(statusCode).json({ statusCode, error, message } satisfies ErrorReply);

/**
 * A second defence against cross-site request forgery beside the SameSite=Strict session cookie
 * (OWASP CSRF Prevention Cheat Sheet: verify the origin with standard headers, and accept only
 * content types a cross-site form cannot send). A state-changing request is refused when its
 * Origin — or, lacking one, its Referer — is not the app's own origin (or one of `extraOrigins`),
 * and when it carries a body, or a Content-Type, other than JSON. Requests with neither header
 * come from non-browser clients, which hold no ambient cookie to abuse.
 */
export function sameOriginWrites(extraOrigins: readonly string[] = []) {
  return (req: Request, res: Response, next: NextFunction) => {
    if (SAFE_METHODS.has(req.method)) return next();
    const own = `${req.protocol}://${req.get('host') ?? ''}`;
    const origin = req.get('origin') ?? originOf(req.get('referer'));
    if (origin !== undefined && origin !== own && !extraOrigins.includes(origin)) {
      return refuse(res, 403, 'Forbidden', 'This request came from another site and was refused');
    }
    const hasBody = req.get('transfer-encoding') !== undefined || Number(req.get('content-length') ?? 0) > 0;
    if ((hasBody || req.get('content-type') !== undefined) && !req.is('application/json') && !isBinaryUpload(req)) {
      return refuse(res, 415, 'Unsupported Media Type', 'Send the request body as application/json');
    }
    return next();
  };
}
