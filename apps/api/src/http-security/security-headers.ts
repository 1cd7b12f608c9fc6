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

/** One header helmet sets (`value`), or removes (`value` null). */
interface HeaderStep {
  name: string;
  value: string | null;
}

/**
 * What a helmet middleware does to a reply, recorded once: helmet only sets and removes headers,
 * and with no directive given as a function (none here: every source above is a string) it does
 * the same to every reply. Recording it once at start and replaying it spares each request
 * helmet's work (the CSP's directives turned into text again, a dozen middlewares called in turn).
 */
export function recordHeaders(middleware: RequestHandler): HeaderStep[] {
  const steps: HeaderStep[] = [];
  let failed: Error | null = null;
  const res = {
    setHeader: (name: string, value: string) => void steps.push({ name, value }),
    removeHeader: (name: string) => void steps.push({ name, value: null }),
  };
  void middleware({} as Request, res as unknown as Response, (error?: unknown) => {
    if (error) failed = error instanceof Error ? error : new Error('helmet could not set its headers');
  });
  if (failed) throw failed;
  return steps;
}

const hstsHeader = recordHeaders(helmet.strictTransportSecurity({ maxAge: 31_536_000, includeSubDomains: true }));

const replay = (res: Response, steps: readonly HeaderStep[]) => {
  for (const { name, value } of steps) {
    if (value === null) res.removeHeader(name);
    else res.setHeader(name, value);
  }
};

/**
 * The security headers of every reply, from helmet (maintained with the browsers' changes rather
 * than by hand), worked out once at start (recordHeaders). HSTS only on replies served over HTTPS
 * (directly, or behind a proxy trusted with TRUST_PROXY): over plain HTTP it means nothing and
 * would pin a loopback development host. Every /api reply carries patient data or may:
 * `Cache-Control: no-store`, no ETag revalidation. `pageHtml` is the web's index.html as served,
 * for its inline scripts' hashes. One middleware, not three: each layer costs the router a step.
 */
export function securityHeaders(options: { pageHtml?: string } = {}): RequestHandler {
  const headers = recordHeaders(
    helmet({
      contentSecurityPolicy: contentSecurityPolicy(inlineScriptSources(options.pageHtml ?? '')),
      strictTransportSecurity: false,
      referrerPolicy: { policy: 'same-origin' },
    }),
  );
  return (req: Request, res: Response, next: NextFunction) => {
    replay(res, headers);
    if (req.secure) replay(res, hstsHeader);
    if (req.path === '/api' || req.path.startsWith('/api/')) res.setHeader('Cache-Control', 'no-store');
    next();
  };
}
