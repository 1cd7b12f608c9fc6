import { createHash } from 'node:crypto';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import helmet from 'helmet';

/** Inline scripts of a page: `<script>` elements without `src`, their text exactly as served. */
const INLINE_SCRIPT = /<script(?![^>]*\bsrc=)[^>]*>([\s\S]*?)<\/script>/gi;

/**
 * The CSP sources that allow a page's own inline scripts, one `'sha256-…'` each. The web's
 * index.html carries one (its early reads, apps/web/src/lib/early-reads/); the hash is taken from
 * the file served, so the policy and the page cannot differ as long as the page is not rebuilt
 * under a running API (restart it after a build, as for any new build).
 */
export function inlineScriptSources(html: string): string[] {
  return [...html.matchAll(INLINE_SCRIPT)].map(
    ([, text]) =>
      `'sha256-${createHash('sha256')
        .update(text ?? '', 'utf8')
        .digest('base64')}'`,
  );
}

/**
 * Scripts only from our own origin, and the served page's inline scripts by their hash; inline
 * styles are allowed because Blueprint and the charts set them.
 */
const contentSecurityPolicy = (inlineScripts: readonly string[]) => ({
  useDefaults: false,
  directives: {
    defaultSrc: ["'self'"],
    scriptSrc: ["'self'", ...inlineScripts],
    styleSrc: ["'self'", "'unsafe-inline'"],
    imgSrc: ["'self'", 'data:', 'blob:'],
    fontSrc: ["'self'", 'data:'],
    connectSrc: ["'self'"],
    objectSrc: ["'none'"],
    frameSrc: ["'self'", 'blob:'],
    frameAncestors: ["'none'"],
    baseUri: ["'self'"],
    formAction: ["'self'"],
  },
});

const hsts = helmet.strictTransportSecurity({ maxAge: 31_536_000, includeSubDomains: true });

/**
 * The security headers of every reply, from helmet (maintained with the browsers' changes rather
 * than by hand). HSTS only on replies served over HTTPS (directly, or behind a proxy trusted with
 * TRUST_PROXY): over plain HTTP it means nothing and would pin a loopback development host.
 * Every /api reply carries patient data or may: `Cache-Control: no-store`, no ETag revalidation.
 * `pageHtml` is the web's index.html as served, for its inline scripts' hashes.
 */
export function securityHeaders(options: { pageHtml?: string } = {}): RequestHandler[] {
  return [
    helmet({
      contentSecurityPolicy: contentSecurityPolicy(inlineScriptSources(options.pageHtml ?? '')),
      strictTransportSecurity: false,
      referrerPolicy: { policy: 'same-origin' },
    }),
    (req: Request, res: Response, next: NextFunction) => (req.secure ? hsts(req, res, next) : next()),
    (req: Request, res: Response, next: NextFunction) => {
      if (req.path === '/api' || req.path.startsWith('/api/')) res.setHeader('Cache-Control', 'no-store');
      next();
    },
  ];
}
